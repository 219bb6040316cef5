import type { Express } from 'express';

type Layer = {
  route?: { path: string; methods: Record<string, boolean> };
  handle: { stack?: Layer[] };
  rawPath?: string;
};

/**
 * Every route the app registers, as "METHOD /full/path" (Express 5's router keeps each
 * mounted router's path in rawPath). Lets the access matrix fail on a route it does not list.
 */
export function registeredRoutes(app: Express, prefix = '/api'): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[], base: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          found.push(`${method.toUpperCase()} ${(base + layer.route.path).replace(/\/$/, '') || '/'}`);
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle.stack, base + mount);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return [...new Set(found)].filter((r) => r.split(' ')[1].startsWith(prefix)).sort();
}
