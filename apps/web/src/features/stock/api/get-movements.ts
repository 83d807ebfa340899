import { movementListResponseSchema, type MovementListQuery, type MovementListResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { searchOf, stockApi, stockKey } from './keys';

/** GET /api/shops/:shopId/stock/movements: the ledger, newest first. */
export function getMovements(shopId: string, query: MovementListQuery, signal?: AbortSignal): Promise<MovementListResponse> {
  return api.get(`${stockApi(shopId)}/movements${searchOf(query)}`, { schema: movementListResponseSchema, signal });
}

export function movementsQueryOptions(shopId: string, query: MovementListQuery) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'movements', query], queryFn: ({ signal }) => getMovements(shopId, query, signal), placeholderData: keepPreviousData });
}

export function useMovements(shopId: string, query: MovementListQuery) {
  return useQuery(movementsQueryOptions(shopId, query));
}
