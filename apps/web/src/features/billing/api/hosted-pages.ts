import type { RedirectResponse } from '@tappet/contracts';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

const redirectSchema = () => import('./schemas').then((m) => m.redirectResponseSchema);

/** POST /api/shops/:shopId/billing/checkout: a Stripe Checkout page for the plan. */
export function startCheckout(shopId: string, planId: string): Promise<RedirectResponse> {
  return api.post(`/shops/${encodeURIComponent(shopId)}/billing/checkout`, { planId }, { schema: redirectSchema });
}

/** POST /api/shops/:shopId/billing/portal: a billing-portal page (card, plan, cancellation). */
export function openPortal(shopId: string): Promise<RedirectResponse> {
  return api.post(`/shops/${encodeURIComponent(shopId)}/billing/portal`, {}, { schema: redirectSchema });
}

/** Goes to a hosted page; tests replace it. */
export const goTo = { url: (url: string) => window.location.assign(url) };

/** Starts checkout and sends the browser there. */
export function useStartCheckout(shopId: string) {
  return useMutation({ mutationFn: (planId: string) => startCheckout(shopId, planId), onSuccess: ({ url }) => goTo.url(url) });
}

/** Opens the billing portal in this tab. */
export function useOpenPortal(shopId: string) {
  return useMutation({ mutationFn: () => openPortal(shopId), onSuccess: ({ url }) => goTo.url(url) });
}
