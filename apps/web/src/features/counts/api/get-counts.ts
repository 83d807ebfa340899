import { countListSchema, type CountList, type CountStatus } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { countsApi, countsKey } from './keys';

/** GET /api/shops/:shopId/counts: counts newest first, with progress. */
export function getCounts(shopId: string, status?: CountStatus, signal?: AbortSignal): Promise<CountList> {
  return api.get(`${countsApi(shopId)}${status ? `?status=${status}` : ''}`, { schema: countListSchema, signal });
}

export function countsQueryOptions(shopId: string, status?: CountStatus) {
  return queryOptions({ queryKey: [...countsKey(shopId), 'list', status ?? 'all'], queryFn: ({ signal }) => getCounts(shopId, status, signal) });
}

export function useCounts(shopId: string, status?: CountStatus) {
  return useQuery(countsQueryOptions(shopId, status));
}
