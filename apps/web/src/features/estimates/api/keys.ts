import { shopQueryKey } from '../../../lib/query-client';

/** Where the estimates API lives for one shop. */
export function estimatesApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/estimates`;
}

/** Every estimates query of a shop starts with this key, so one invalidation refreshes them all. */
export function estimatesKey(shopId: string) {
  return shopQueryKey(shopId, 'estimates');
}
