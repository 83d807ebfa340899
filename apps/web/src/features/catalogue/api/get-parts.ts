import { partListResponseSchema, type PartListResponse, type PartOrigin, type PartStatusValue } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { shopApi } from './keys';

/** The list's filters and page, as the screen holds them. */
export interface PartListParams {
  q?: string;
  category?: string;
  origin?: PartOrigin;
  status?: PartStatusValue;
  problemsOnly?: boolean;
  page?: number;
  pageSize?: number;
}

/** The query string for GET /parts: only the filters that are set. */
export function partListSearch(params: PartListParams): string {
  const search = new URLSearchParams();
  if (params.q) search.set('q', params.q);
  if (params.category) search.set('category', params.category);
  if (params.origin) search.set('origin', params.origin);
  if (params.status) search.set('status', params.status);
  if (params.problemsOnly) search.set('problemsOnly', 'true');
  if (params.page && params.page > 1) search.set('page', String(params.page));
  if (params.pageSize) search.set('pageSize', String(params.pageSize));
  return search.toString();
}

/** GET /api/shops/:shopId/parts: one page of the catalogue, filtered. */
export function getParts(shopId: string, params: PartListParams, signal?: AbortSignal): Promise<PartListResponse> {
  const search = partListSearch(params);
  return api.get(`${shopApi(shopId)}/parts${search ? `?${search}` : ''}`, { schema: partListResponseSchema, signal });
}

export function partsQueryOptions(shopId: string, params: PartListParams) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'catalogue', 'parts', params),
    queryFn: ({ signal }) => getParts(shopId, params, signal),
    // Keep the last page on screen while the next one loads, so the table does not flash.
    placeholderData: keepPreviousData,
  });
}

export function useParts(shopId: string, params: PartListParams, options: { enabled?: boolean } = {}) {
  return useQuery({ ...partsQueryOptions(shopId, params), enabled: options.enabled ?? true });
}
