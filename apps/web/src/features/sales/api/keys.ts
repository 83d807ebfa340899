import { shopQueryKey } from '../../../lib/query-client';

/** Where the sales API lives for one shop. */
export function salesApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/sales`;
}

/** Every sales query of a shop starts with this key, so one invalidation refreshes them all. */
export function salesKey(shopId: string) {
  return shopQueryKey(shopId, 'sales');
}
