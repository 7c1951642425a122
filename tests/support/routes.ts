import type { Express } from 'express';

export interface RegisteredRoute {
  method: string;
  path: string;
}

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every route registered on the app, read from Express's own router stack. */
export function registeredRoutes(app: Express): RegisteredRoute[] {
  const out: RegisteredRoute[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') out.push({ method: method.toUpperCase(), path: layer.route.path });
        }
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack);
  return out;
}
