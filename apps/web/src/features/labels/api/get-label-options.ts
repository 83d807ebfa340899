import { labelOptionsSchema, type LabelOptions } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** GET /api/shops/:shopId/labels/options: the shop's label format and every format. */
export function getLabelOptions(shopId: string, signal?: AbortSignal): Promise<LabelOptions> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/labels/options`, { schema: labelOptionsSchema, signal });
}

export function labelOptionsQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'labels', 'options'),
    queryFn: ({ signal }) => getLabelOptions(shopId, signal),
  });
}

export function useLabelOptions(shopId: string) {
  return useQuery(labelOptionsQueryOptions(shopId));
}
