import type { Express } from 'express';

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle: { stack?: Layer[] };
  rawPath?: string | string[];
}

/** Every `METHOD /path` mounted under /api, found by walking the Express router stack. */
export function mountedApiRoutes(app: Express): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        // A path list (a guard mounted on several routes, e.g. the e-mail allowance) names each.
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const method of Object.keys(layer.route.methods)) for (const path of paths) found.push(`${method.toUpperCase()} ${(prefix + path).replace(/\/$/, '') || '/'}`);
      } else if (layer.handle.stack && typeof layer.rawPath === 'string') {
        walk(layer.handle.stack, prefix + layer.rawPath.replace(/\/$/, ''));
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  // A guard on a route that a router also serves is the same route.
  return [...new Set(found.filter((r) => r.includes(' /api')))].sort();
}
