import { shopQueryKey } from '../../../lib/query-client';

/** Where a shop's jobs live in the API. */
export function jobsApi(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}/jobs`;
}

/** Every job query of a shop starts with this key, so one invalidation refreshes them all. */
export function jobsKey(shopId: string) {
  return shopQueryKey(shopId, 'jobs');
}
