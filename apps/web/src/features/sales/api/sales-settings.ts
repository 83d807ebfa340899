import { salesSettingsSchema, type SalesSettings } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { salesApi, salesKey } from './keys';

/** GET /api/shops/:shopId/sales/settings: pricing rules, tax rounding and rates. */
export function getSalesSettings(shopId: string, signal?: AbortSignal): Promise<SalesSettings> {
  return api.get(`${salesApi(shopId)}/settings`, { schema: salesSettingsSchema, signal });
}

export function salesSettingsQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...salesKey(shopId), 'settings'], queryFn: ({ signal }) => getSalesSettings(shopId, signal) });
}

export function useSalesSettings(shopId: string) {
  return useQuery(salesSettingsQueryOptions(shopId));
}
