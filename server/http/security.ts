// Security headers (helmet). The CSP allows what the exported Expo web build needs: its own
// scripts, and inline styles (react-native-web writes style rules at run time).
import helmet from 'helmet';
import type { RequestHandler } from 'express';

export function securityHeaders(production: boolean): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
        // Only behind TLS: on plain http://127.0.0.1 it would send the browser to a port with no TLS.
        ...(production ? { 'upgrade-insecure-requests': [] } : {}),
      },
    },
    strictTransportSecurity: production,
    crossOriginEmbedderPolicy: false,
  });
}
