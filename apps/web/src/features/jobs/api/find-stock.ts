import { stockListResponseSchema, type StockListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** GET /api/shops/:shopId/stock?q=: stock lines (part × bin × condition) with free quantities. */
export function findStock(shopId: string, q: string, signal?: AbortSignal): Promise<StockListResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/stock?q=${encodeURIComponent(q)}&pageSize=20`, { schema: stockListResponseSchema, signal });
}

export function findStockQueryOptions(shopId: string, q: string) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'stock', 'job-search', q), queryFn: ({ signal }) => findStock(shopId, q, signal) });
}

export function useFindStock(shopId: string, q: string) {
  return useQuery({ ...findStockQueryOptions(shopId, q), enabled: q.trim().length >= 2 });
}
