import { shopQueryKey } from '../../../lib/query-client';

/** Where a shop's vehicles live in the API. */
export function vehiclesApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/vehicles`;
}

/** Every vehicle query of a shop starts with this key, so one invalidation refreshes them all. */
export function vehiclesKey(shopId: string) {
  return shopQueryKey(shopId, 'vehicles');
}

/** Every customer query of a shop. */
export function customersKey(shopId: string) {
  return shopQueryKey(shopId, 'customers');
}
