import { binListResponseSchema, type BinListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** GET /api/shops/:shopId/stock/bins: where goods can be received into (features do not share code, so fetched here too). */
export function getBins(shopId: string, signal?: AbortSignal): Promise<BinListResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/stock/bins`, { schema: binListResponseSchema, signal });
}

export function binsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'stock', 'bins'), queryFn: ({ signal }) => getBins(shopId, signal) });
}

export function useBins(shopId: string) {
  return useQuery(binsQueryOptions(shopId));
}
