import { shopDetailSchema, type ShopDetail } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** GET /api/shops/:shopId: the shop's details (another shop's id is a 404). */
export function getShop(shopId: string, signal?: AbortSignal): Promise<ShopDetail> {
  return api.get(`/shops/${encodeURIComponent(shopId)}`, { schema: shopDetailSchema, signal });
}

export function shopQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'detail'),
    queryFn: ({ signal }) => getShop(shopId, signal),
  });
}

export function useShop(shopId: string) {
  return useQuery(shopQueryOptions(shopId));
}
