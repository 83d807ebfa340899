import type { PartStockResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { stockApi, stockKey } from './keys';
import { partStockCheck } from './part-stock-check';

/** GET /api/shops/:shopId/stock/parts/:partId: a part's stock, holds, serialised items, value and fill options. */
export function getPartStock(shopId: string, partId: string, signal?: AbortSignal): Promise<PartStockResponse> {
  return api.get(`${stockApi(shopId)}/parts/${encodeURIComponent(partId)}`, { schema: partStockCheck, signal });
}

export function partStockQueryOptions(shopId: string, partId: string) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'part', partId], queryFn: ({ signal }) => getPartStock(shopId, partId, signal) });
}

export function usePartStock(shopId: string, partId: string) {
  return useQuery(partStockQueryOptions(shopId, partId));
}
