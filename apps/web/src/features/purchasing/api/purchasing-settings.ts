import { purchasingSettingsSchema, type PurchasingSettings } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/settings: the reorder list's demand window and dead-stock period. */
export function getPurchasingSettings(shopId: string, signal?: AbortSignal): Promise<PurchasingSettings> {
  return api.get(`${purchasingApi(shopId)}/settings`, { schema: purchasingSettingsSchema, signal });
}

export function purchasingSettingsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'settings'], queryFn: ({ signal }) => getPurchasingSettings(shopId, signal) });
}

export function usePurchasingSettings(shopId: string) {
  return useQuery(purchasingSettingsQueryOptions(shopId));
}

/** PATCH /api/shops/:shopId/purchasing/settings (owners). */
export const updatePurchasingSettings = (shopId: string, input: Partial<PurchasingSettings>) => api.patch<PurchasingSettings>(`${purchasingApi(shopId)}/settings`, input, { schema: purchasingSettingsSchema });
