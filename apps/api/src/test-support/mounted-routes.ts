import type { Express } from 'express';

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle: { stack?: Layer[] };
  rawPath?: string | string[];
}

/** Every `METHOD /path` mounted under /api, found by walking the Express router stack. */
export function mountedApiRoutes(app: Express): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) found.push(`${method.toUpperCase()} ${(prefix + layer.route.path).replace(/\/$/, '') || '/'}`);
      } else if (layer.handle.stack && typeof layer.rawPath === 'string') {
        walk(layer.handle.stack, prefix + layer.rawPath.replace(/\/$/, ''));
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return found.filter((r) => r.includes(' /api')).sort();
}
