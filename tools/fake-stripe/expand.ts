// `expand[]`: replaces id strings along a dotted path with the objects they name. Lists are walked
// through their `data` arrays (`data.product`), and intermediate ids are expanded on the way
// (`subscription.latest_invoice`), as Stripe does. Paths may be at most four levels deep.
import { invalid } from './errors.ts';

/** Expands `paths` inside `root` in place and returns it. Throws a 400 for a path that names no id. */
export function expand<T>(root: T, paths: readonly string[] | undefined, resolve: (id: string) => unknown): T {
  for (const path of paths ?? []) {
    const segments = path.split('.');
    if (segments.length > 4 || segments.some((s) => s === '')) throw invalid('expand', `Invalid expand path: ${path}. Paths are at most four levels deep.`);
    walk(root, segments, path, resolve);
  }
  return root;
}

function walk(target: unknown, segments: string[], path: string, resolve: (id: string) => unknown): void {
  if (Array.isArray(target)) {
    for (const element of target) walk(element, segments, path, resolve);
    return;
  }
  if (target === null || typeof target !== 'object') return;
  const [key, ...rest] = segments as [string, ...string[]];
  const holder = target as Record<string, unknown>;
  if (!Object.hasOwn(holder, key)) throw invalid('expand', `This property cannot be expanded (${path}).`);
  let value = holder[key];
  if (typeof value === 'string') {
    const resolved = resolve(value);
    if (resolved === undefined) throw invalid('expand', `This property cannot be expanded (${path}).`);
    holder[key] = resolved;
    value = resolved;
  }
  if (rest.length > 0) walk(value, rest, path, resolve);
}
