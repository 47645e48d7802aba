// CSRF protection: one random token per session, handed out by GET /api/auth/csrf and required as
// X-CSRF-Token on every state-changing /api request (session cookies alone must not be enough).
import crypto from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { Forbidden } from '@/server/http/errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
export const CSRF_HEADER = 'x-csrf-token';

/** Returns the session's token, creating it on first use. */
export function csrfTokenFor(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = crypto.randomBytes(32).toString('base64url');
  return req.session.csrfToken;
}

function sameToken(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && crypto.timingSafeEqual(x, y);
}

export const requireCsrf: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const sent = req.get(CSRF_HEADER);
  const expected = req.session?.csrfToken;
  if (!sent || !expected || !sameToken(sent, expected)) {
    return next(new Forbidden('The security token is missing or out of date. Reload and try again.', 'csrf'));
  }
  next();
};
