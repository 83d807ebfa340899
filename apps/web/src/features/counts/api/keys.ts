import { shopQueryKey } from '../../../lib/query-client';

/** Where the counts API lives for one shop. */
export function countsApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/counts`;
}

/** Every count query of a shop starts with this key. */
export function countsKey(shopId: string) {
  return shopQueryKey(shopId, 'counts');
}
