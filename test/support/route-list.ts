/**
 * Lists every route an Express 5 app answers, as `METHOD /path`, by walking its router stack
 * (nested routers carry their mount path in `rawPath`). The security walk uses it to fail when a
 * route is added without an entry in its table.
 */
import type { Express } from 'express';

interface Layer {
  rawPath?: string;
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every `METHOD /path` under `/api`, sorted, e.g. `GET /api/users/:id`. */
export function listApiRoutes(app: Express): string[] {
  const found = new Set<string>();
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          const path = (prefix + (layer.route.path === '/' ? '' : layer.route.path)) || '/';
          found.add(`${method.toUpperCase()} ${path}`);
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, prefix + (layer.rawPath && layer.rawPath !== '/' ? layer.rawPath : ''));
      }
    }
  };
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(router.stack, '');
  return [...found].filter((r) => r.split(' ')[1].startsWith('/api')).sort();
}
