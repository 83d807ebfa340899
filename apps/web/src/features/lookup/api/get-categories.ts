import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** The shop's part categories, for the lookup's category filter (the catalogue list answers them with any page). */
export async function getCategories(shopId: string, signal?: AbortSignal): Promise<string[]> {
  const page = await api.get(`/shops/${encodeURIComponent(shopId)}/parts?pageSize=1`, { schema: () => import('./schemas').then((m) => m.partListResponseSchema), signal });
  return page.categories;
}

export function categoriesQueryOptions(shopId: string) {
  return queryOptions({
    // Under the catalogue key: a catalogue change refreshes the choices too.
    queryKey: shopQueryKey(shopId, 'catalogue', 'lookup-categories'),
    queryFn: ({ signal }) => getCategories(shopId, signal),
    staleTime: 60_000,
  });
}

/** Fetched only once someone opens the filters. */
export function useCategories(shopId: string, enabled: boolean) {
  return useQuery({ ...categoriesQueryOptions(shopId), enabled });
}
