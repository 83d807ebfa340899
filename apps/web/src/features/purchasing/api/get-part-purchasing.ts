import { partPurchasingResponseSchema } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

export type PartPurchasingView = z.infer<typeof partPurchasingResponseSchema>;

/** GET /api/shops/:shopId/purchasing/parts/:partId: the preferred supplier, min/max set by hand, and every listing of the part. */
export function getPartPurchasing(shopId: string, partId: string, signal?: AbortSignal): Promise<PartPurchasingView> {
  return api.get(`${purchasingApi(shopId)}/parts/${encodeURIComponent(partId)}`, { schema: partPurchasingResponseSchema, signal });
}

export function partPurchasingQueryOptions(shopId: string, partId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'part', partId], queryFn: ({ signal }) => getPartPurchasing(shopId, partId, signal) });
}

export function usePartPurchasing(shopId: string, partId: string) {
  return useQuery(partPurchasingQueryOptions(shopId, partId));
}
