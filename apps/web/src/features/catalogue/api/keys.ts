import { shopQueryKey } from '../../../lib/query-client';

/** Where the catalogue's API lives for one shop. */
export function shopApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}`;
}

/** Every catalogue query of a shop starts with this key, so one invalidation refreshes them all. */
export function catalogueKey(shopId: string) {
  return shopQueryKey(shopId, 'catalogue');
}
