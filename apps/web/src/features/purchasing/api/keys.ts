import { shopQueryKey } from '../../../lib/query-client';

/** Where the purchasing API lives for one shop. */
export function purchasingApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/purchasing`;
}

/** Every purchasing query of a shop starts with this key, so one invalidation refreshes them all. */
export function purchasingKey(shopId: string) {
  return shopQueryKey(shopId, 'purchasing');
}
