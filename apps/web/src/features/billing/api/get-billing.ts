import { billingOverviewSchema, type BillingOverview } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { billingKeys } from './keys';

/** GET /api/shops/:shopId/billing: plan, state, trial, usage and the plans to choose from (owners). */
export function getBilling(shopId: string, signal?: AbortSignal): Promise<BillingOverview> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/billing`, { schema: billingOverviewSchema, signal });
}

export function billingQueryOptions(shopId: string) {
  return queryOptions({ queryKey: billingKeys.overview(shopId), queryFn: ({ signal }) => getBilling(shopId, signal) });
}

export function useBilling(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...billingQueryOptions(shopId), enabled: options.enabled ?? true });
}
