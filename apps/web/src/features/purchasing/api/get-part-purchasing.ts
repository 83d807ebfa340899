import type { PartPurchasing, PartPurchasingResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, apiRequest } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';
import { partPurchasingCheck } from './part-purchasing-check';

export type PartPurchasingView = PartPurchasingResponse;

const partPath = (shopId: string, partId: string) => `${purchasingApi(shopId)}/parts/${encodeURIComponent(partId)}`;

/** GET /api/shops/:shopId/purchasing/parts/:partId: the preferred supplier, min/max set by hand, and every listing of the part. */
export function getPartPurchasing(shopId: string, partId: string, signal?: AbortSignal): Promise<PartPurchasingView> {
  return api.get(partPath(shopId, partId), { schema: partPurchasingCheck, signal });
}

/** PUT the same path: the preferred supplier and the minimum and maximum set by hand. */
export const setPartPurchasing = (shopId: string, input: { partId: string; body: PartPurchasing }) =>
  apiRequest<PartPurchasingView>(partPath(shopId, input.partId), { method: 'PUT', body: input.body, schema: partPurchasingCheck });

export function partPurchasingQueryOptions(shopId: string, partId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'part', partId], queryFn: ({ signal }) => getPartPurchasing(shopId, partId, signal) });
}

export function usePartPurchasing(shopId: string, partId: string) {
  return useQuery(partPurchasingQueryOptions(shopId, partId));
}
