import type { SellPricesResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { salesApi, salesKey } from './keys';
import { sellPricesCheck } from './sell-prices-check';

/** GET /api/shops/:shopId/sales/sell-prices: sell prices (and, for those allowed, cost and margin). */
export function getSellPrices(shopId: string, partIds: readonly string[], signal?: AbortSignal): Promise<SellPricesResponse> {
  const query = new URLSearchParams();
  for (const id of partIds) query.append('partIds', id);
  return api.get(`${salesApi(shopId)}/sell-prices?${query.toString()}`, { schema: sellPricesCheck, signal });
}

export function sellPricesQueryOptions(shopId: string, partIds: readonly string[]) {
  return queryOptions({ queryKey: [...salesKey(shopId), 'sell-prices', [...partIds].sort()], queryFn: ({ signal }) => getSellPrices(shopId, partIds, signal), enabled: partIds.length > 0 });
}

export function useSellPrices(shopId: string, partIds: readonly string[]) {
  return useQuery(sellPricesQueryOptions(shopId, partIds));
}
