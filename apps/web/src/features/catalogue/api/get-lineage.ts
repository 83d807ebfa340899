import type { LineageGraphResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { shopApi } from './keys';
import { lineageGraphCheck } from './part-page-checks';

/** GET /api/shops/:shopId/parts/:partId/lineage: the bounded graph around a part, for the picture. */
export function getLineage(shopId: string, partId: string, signal?: AbortSignal): Promise<LineageGraphResponse> {
  return api.get(`${shopApi(shopId)}/parts/${encodeURIComponent(partId)}/lineage`, { schema: lineageGraphCheck, signal });
}

export function lineageQueryOptions(shopId: string, partId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'catalogue', 'lineage', partId),
    queryFn: ({ signal }) => getLineage(shopId, partId, signal),
  });
}

export function useLineage(shopId: string, partId: string) {
  return useQuery(lineageQueryOptions(shopId, partId));
}
