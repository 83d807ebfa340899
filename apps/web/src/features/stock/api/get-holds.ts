import { holdListResponseSchema, type HoldListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { searchOf, stockApi, stockKey } from './keys';

export type HoldStatus = 'active' | 'released' | 'issued';

/** GET /api/shops/:shopId/stock/holds: holds of one status (active by default). */
export function getHolds(shopId: string, status: HoldStatus = 'active', signal?: AbortSignal): Promise<HoldListResponse> {
  return api.get(`${stockApi(shopId)}/holds${searchOf({ status })}`, { schema: holdListResponseSchema, signal });
}

export function holdsQueryOptions(shopId: string, status: HoldStatus = 'active') {
  return queryOptions({ queryKey: [...stockKey(shopId), 'holds', status], queryFn: ({ signal }) => getHolds(shopId, status, signal) });
}

/** `enabled: false` when the caller already has the holds (the part page's stock answer carries its own). */
export function useHolds(shopId: string, status: HoldStatus = 'active', options: { enabled?: boolean } = {}) {
  return useQuery({ ...holdsQueryOptions(shopId, status), enabled: options.enabled ?? true });
}
