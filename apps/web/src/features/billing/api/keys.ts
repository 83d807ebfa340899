import { shopQueryKey } from '../../../lib/query-client';

/** Query keys of billing and support access (shop-prefixed, so a shop switch drops them). */
export const billingKeys = {
  all: (shopId: string) => shopQueryKey(shopId, 'billing'),
  status: (shopId: string) => shopQueryKey(shopId, 'billing', 'status'),
  overview: (shopId: string) => shopQueryKey(shopId, 'billing', 'overview'),
  supportAccess: (shopId: string) => shopQueryKey(shopId, 'support-access'),
};
