import { stockListResponseSchema, type StockListQuery, type StockListResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { searchOf, stockApi, stockKey } from './keys';

/** GET /api/shops/:shopId/stock: stock lines with on hand, held and free. */
export function getStock(shopId: string, query: StockListQuery, signal?: AbortSignal): Promise<StockListResponse> {
  return api.get(`${stockApi(shopId)}${searchOf(query)}`, { schema: stockListResponseSchema, signal });
}

export function stockQueryOptions(shopId: string, query: StockListQuery) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'lines', query], queryFn: ({ signal }) => getStock(shopId, query, signal), placeholderData: keepPreviousData });
}

export function useStock(shopId: string, query: StockListQuery) {
  return useQuery(stockQueryOptions(shopId, query));
}
