import type { BillingStatus } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { billingStatusCheck } from './billing-status-check';
import { billingKeys } from './keys';

/** GET /api/shops/:shopId/billing/status: the state and read-only reason (every member). */
export function getBillingStatus(shopId: string, signal?: AbortSignal): Promise<BillingStatus> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/billing/status`, { schema: billingStatusCheck, signal });
}

export function billingStatusQueryOptions(shopId: string) {
  // Refreshed now and then: a payment made in another tab lifts the notice without a reload.
  return queryOptions({ queryKey: billingKeys.status(shopId), queryFn: ({ signal }) => getBillingStatus(shopId, signal), staleTime: 60_000 });
}

export function useBillingStatus(shopId: string) {
  return useQuery(billingStatusQueryOptions(shopId));
}
