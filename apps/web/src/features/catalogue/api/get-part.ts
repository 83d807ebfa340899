import type { PartDetailResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { shopApi } from './keys';
import { partDetailCheck } from './part-page-checks';

/** GET /api/shops/:shopId/parts/:partId: the part, its links both ways, fitments, current parts and problems. */
export function getPart(shopId: string, partId: string, signal?: AbortSignal): Promise<PartDetailResponse> {
  return api.get(`${shopApi(shopId)}/parts/${encodeURIComponent(partId)}`, { schema: partDetailCheck, signal });
}

export function partQueryOptions(shopId: string, partId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'catalogue', 'part', partId),
    queryFn: ({ signal }) => getPart(shopId, partId, signal),
  });
}

export function usePart(shopId: string, partId: string) {
  return useQuery(partQueryOptions(shopId, partId));
}
