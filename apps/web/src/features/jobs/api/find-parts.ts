import { partSearchResponseSchema, type PartSearchResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/**
 * GET /api/shops/:shopId/parts/search: the forgiving lookup, for a job. A superseded number
 * answers with the part itself and every option that can fill it (its replacement, kits), each
 * with its stock per bin and condition.
 */
export function findParts(shopId: string, q: string, signal?: AbortSignal): Promise<PartSearchResponse> {
  const search = new URLSearchParams({ q, limit: '12' });
  return api.get(`/shops/${encodeURIComponent(shopId)}/parts/search?${search.toString()}`, { schema: partSearchResponseSchema, signal });
}

export function findPartsQueryOptions(shopId: string, q: string) {
  return queryOptions({
    // Under the stock key: a hold or issue (which invalidates stock) refreshes the free quantities.
    queryKey: shopQueryKey(shopId, 'stock', 'job-lookup', q),
    queryFn: ({ signal }) => findParts(shopId, q, signal),
    placeholderData: keepPreviousData,
  });
}

/** The lookup's answer for `q` (nothing is fetched under 2 characters). */
export function useFindParts(shopId: string, q: string) {
  return useQuery({ ...findPartsQueryOptions(shopId, q.trim()), enabled: q.trim().length >= 2 });
}
