import type { Express } from 'express';

export interface RouteEntry {
  method: string;
  path: string;
}

interface Layer {
  rawPath?: string | string[];
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every method and path the app's routers answer, found by walking Express's router stack. */
export function listRoutes(app: Express): RouteEntry[] {
  const out: RouteEntry[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      const raw = Array.isArray(layer.rawPath) ? layer.rawPath[0] : layer.rawPath;
      const here = raw && raw !== '/' ? prefix + raw : prefix;
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method !== '_all') out.push({ method: method.toUpperCase(), path: (prefix + layer.route.path).replace(/\/$/, '') || '/' });
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, here);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return out;
}
