import { shopQueryKey } from '../../../lib/query-client';

/** Query keys of the staff screen (shop-prefixed, so a shop switch drops them). */
export const staffKeys = {
  list: (shopId: string) => shopQueryKey(shopId, 'staff'),
};
