// Lists every route an Express 5 app answers ("GET /api/team", …) by walking its router layers, so
// tests can prove the authorisation table covers every route, including ones added later.
import type { Express } from 'express';

type Layer = {
  rawPath?: string | string[];
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
};

function join(prefix: string, p: string): string {
  if (p === '/' || p === '') return prefix || '/';
  return `${prefix}${p.startsWith('/') ? p : `/${p}`}`.replace(/\/+$/, '') || '/';
}

function walk(stack: Layer[], prefix: string, out: string[]): void {
  for (const layer of stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const p of paths) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') out.push(`${method.toUpperCase()} ${join(prefix, p)}`);
        }
      }
    } else if (layer.handle?.stack) {
      const raw = layer.rawPath ?? '/';
      for (const p of Array.isArray(raw) ? raw : [raw]) {
        const mount = join(prefix, p);
        walk(layer.handle.stack, mount === '/' ? '' : mount, out);
      }
    }
  }
}

export function listRoutes(app: Express): string[] {
  const router = (app as unknown as { router?: { stack: Layer[] } }).router;
  const out: string[] = [];
  if (router) walk(router.stack, '', out);
  return [...new Set(out)].sort();
}
