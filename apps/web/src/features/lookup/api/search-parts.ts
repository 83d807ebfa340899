import type { PartSearchResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { filterParams, type LookupFilters } from '../hooks/use-lookup-filters';

/** Results shown on the lookup screen. */
export const LOOKUP_LIMIT = 20;

/** GET /api/shops/:shopId/parts/search: the forgiving lookup. */
export function searchParts(shopId: string, q: string, filters: LookupFilters = {}, signal?: AbortSignal): Promise<PartSearchResponse> {
  const search = new URLSearchParams({ q, limit: String(LOOKUP_LIMIT), ...filterParams(filters) });
  return api.get(`/shops/${encodeURIComponent(shopId)}/parts/search?${search.toString()}`, { schema: () => import('./schemas').then((m) => m.partSearchResponseSchema), signal });
}

export function searchPartsQueryOptions(shopId: string, q: string, filters: LookupFilters = {}) {
  return queryOptions({
    // Under the shop's catalogue key, so every catalogue change (which invalidates it) refreshes lookups too.
    queryKey: shopQueryKey(shopId, 'catalogue', 'lookup', q, filterParams(filters)),
    queryFn: ({ signal }) => searchParts(shopId, q, filters, signal),
    // The previous answer stays on screen while the next one loads: no flicker while typing.
    placeholderData: keepPreviousData,
    staleTime: 10_000,
  });
}

/** The lookup's answer for `q` (nothing is fetched for an empty query). */
export function useSearchParts(shopId: string, q: string, filters: LookupFilters = {}) {
  return useQuery({ ...searchPartsQueryOptions(shopId, q, filters), enabled: q.trim() !== '' });
}
