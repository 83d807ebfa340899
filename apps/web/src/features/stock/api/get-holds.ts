import { holdListResponseSchema, type HoldListResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { searchOf, stockApi, stockKey } from './keys';

export type HoldStatus = 'active' | 'released' | 'issued';

/** Rows per page of the held stock screen. */
export const HOLDS_PAGE_SIZE = 50;

/** GET /api/shops/:shopId/stock/holds: one page of the holds of one status (active by default). */
export function getHolds(shopId: string, status: HoldStatus = 'active', page = 1, signal?: AbortSignal): Promise<HoldListResponse> {
  return api.get(`${stockApi(shopId)}/holds${searchOf({ status, page, pageSize: HOLDS_PAGE_SIZE })}`, { schema: holdListResponseSchema, signal });
}

export function holdsQueryOptions(shopId: string, status: HoldStatus = 'active', page = 1) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'holds', status, page], queryFn: ({ signal }) => getHolds(shopId, status, page, signal) });
}

/** `enabled: false` when the caller already has the holds (the part page's stock answer carries its own). */
export function useHolds(shopId: string, status: HoldStatus = 'active', options: { enabled?: boolean; page?: number } = {}) {
  // The page being left stays on screen until the next one arrives.
  return useQuery({ ...holdsQueryOptions(shopId, status, options.page ?? 1), enabled: options.enabled ?? true, placeholderData: keepPreviousData });
}
