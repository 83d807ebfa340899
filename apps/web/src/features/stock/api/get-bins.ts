import { binListResponseSchema, type BinListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { stockApi, stockKey } from './keys';

/** GET /api/shops/:shopId/stock/bins: every bin with what it holds. */
export function getBins(shopId: string, signal?: AbortSignal): Promise<BinListResponse> {
  return api.get(`${stockApi(shopId)}/bins`, { schema: binListResponseSchema, signal });
}

export function binsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'bins'], queryFn: ({ signal }) => getBins(shopId, signal) });
}

export function useBins(shopId: string) {
  return useQuery(binsQueryOptions(shopId));
}
