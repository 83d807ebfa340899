import { supplierReturnListResponseSchema, type SupplierReturn } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/returns: returns and cores, open and credited. */
export function getReturns(shopId: string, signal?: AbortSignal): Promise<{ returns: SupplierReturn[] }> {
  return api.get(`${purchasingApi(shopId)}/returns`, { schema: supplierReturnListResponseSchema, signal });
}

export function returnsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'returns'], queryFn: ({ signal }) => getReturns(shopId, signal) });
}

export function useReturns(shopId: string) {
  return useQuery(returnsQueryOptions(shopId));
}
