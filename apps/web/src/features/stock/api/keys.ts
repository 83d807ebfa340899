import { shopQueryKey } from '../../../lib/query-client';

/** Where the stock API lives for one shop. */
export function stockApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/stock`;
}

/** Every stock query of a shop starts with this key, so one invalidation after a movement refreshes them all. */
export function stockKey(shopId: string) {
  return shopQueryKey(shopId, 'stock');
}

/** Query string from the set values of `params`. */
export function searchOf(params: object): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (typeof value === 'string' ? value !== '' : typeof value === 'number' || typeof value === 'boolean') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `?${text}` : '';
}
