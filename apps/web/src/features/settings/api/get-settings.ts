import { shopSettingsSchema, type ShopSettings } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

// The response is read with the plain shape: the input schema's currency check would reject a
// code this browser's Intl does not list, and that must not hide the page.
const settingsResponseSchema = shopSettingsSchema.extend({ currency: z.string() });

export const settingsKey = (shopId: string) => shopQueryKey(shopId, 'settings');

/** GET /api/shops/:shopId/settings (owners). */
export function getSettings(shopId: string, signal?: AbortSignal): Promise<ShopSettings> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/settings`, { schema: settingsResponseSchema, signal });
}

export function settingsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: settingsKey(shopId), queryFn: ({ signal }) => getSettings(shopId, signal) });
}

export function useSettings(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...settingsQueryOptions(shopId), enabled: options.enabled ?? true });
}
