import type { Express } from 'express';

interface Layer {
  route?: { path: string | RegExp; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** "METHOD /path" for every route registered on the app's routers (Express 5 router internals). */
export function listRoutes(app: Express): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route && typeof layer.route.path === 'string') {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') found.push(`${method.toUpperCase()} ${layer.route.path}`);
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack);
  return found.sort();
}
