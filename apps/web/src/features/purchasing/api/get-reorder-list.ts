import { reorderListResponseSchema, type ReorderListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/reorder-list: suggestions with their reasons, groups, slow and dead stock. */
export function getReorderList(shopId: string, signal?: AbortSignal): Promise<ReorderListResponse> {
  return api.get(`${purchasingApi(shopId)}/reorder-list`, { schema: reorderListResponseSchema, signal });
}

export function reorderListQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'reorder-list'], queryFn: ({ signal }) => getReorderList(shopId, signal) });
}

export function useReorderList(shopId: string) {
  return useQuery(reorderListQueryOptions(shopId));
}
