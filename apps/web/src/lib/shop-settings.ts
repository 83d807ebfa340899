import { shopSettingsSchema, type ShopSettings } from '@tappet/contracts';
import { formatMoney } from '@tappet/domain';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { useCallback } from 'react';
import { z } from 'zod';
import { api } from './api-client';
import { shopQueryKey } from './query-client';

// The shop's settings are app-wide: every member reads them (currency, units, rates), and any
// screen that shows money or a measurement needs them. The owner edits them in features/settings.

// The response is read with the plain shape: the input schema's currency check would reject a
// code this browser's Intl does not list, and that must not hide the page.
const settingsResponseSchema = shopSettingsSchema.extend({ currency: z.string() });

export const settingsKey = (shopId: string) => shopQueryKey(shopId, 'settings');

/** GET /api/shops/:shopId/settings (every member reads; the owner changes). */
export function getSettings(shopId: string, signal?: AbortSignal): Promise<ShopSettings> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/settings`, { schema: settingsResponseSchema, signal });
}

export function settingsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: settingsKey(shopId), queryFn: ({ signal }) => getSettings(shopId, signal), staleTime: 60_000 });
}

export function useSettings(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...settingsQueryOptions(shopId), enabled: options.enabled ?? true });
}

/**
 * Formats minor units in the shop's currency ("£1,234.56"). Until the settings arrive it shows
 * the plain amount, so a figure is never hidden behind a spinner.
 */
export function useFormatMoney(shopId: string): (minor: number) => string {
  const { data } = useSettings(shopId);
  const currency = data?.currency;
  return useCallback((minor: number) => (currency ? formatMoney(minor, currency) : (minor / 100).toFixed(2)), [currency]);
}
