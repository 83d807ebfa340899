import { countDetailSchema, type CountDetail } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { countsApi, countsKey } from './keys';

/** GET /api/shops/:shopId/counts/:countId: the count and every line. */
export function getCount(shopId: string, countId: string, signal?: AbortSignal): Promise<CountDetail> {
  return api.get(`${countsApi(shopId)}/${encodeURIComponent(countId)}`, { schema: countDetailSchema, signal });
}

/** Refreshed every 10 s while open: several people count at once, and the progress is live. */
export function countQueryOptions(shopId: string, countId: string) {
  return queryOptions({
    queryKey: [...countsKey(shopId), 'detail', countId],
    queryFn: ({ signal }) => getCount(shopId, countId, signal),
    refetchInterval: (query) => (query.state.data?.status === 'open' ? 10_000 : false),
  });
}

export function useCount(shopId: string, countId: string) {
  return useQuery(countQueryOptions(shopId, countId));
}
