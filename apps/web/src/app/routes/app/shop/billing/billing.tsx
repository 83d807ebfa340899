import type { QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { billingQueryOptions } from '../../../../../features/billing/api/get-billing';
import { billingKeys } from '../../../../../features/billing/api/keys';
import { BillingScreen } from '../../../../../features/billing/components/billing-screen';
import { abilityFor, canOn, useCan } from '../../../../../lib/ability';
import { meQueryOptions, useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { OwnerOnly } from '../admin/owner-only';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'read', 'Billing', { shopId: params.shopId })) {
      void queryClient.prefetchQuery(billingQueryOptions(params.shopId));
    }
    return null;
  };

/** Billing (owners): plan, state, trial, usage; Checkout and the billing portal. */
export default function BillingRoute() {
  const { shopId = '' } = useParams();
  const [search] = useSearchParams();
  const me = useMe();
  const queryClient = useQueryClient();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canRead = useCan('read', 'Billing', { shopId });
  const checkout = search.get('checkout');
  useDocumentTitle(membership ? `${membership.shopName} · Billing` : 'Billing');

  // Back from Checkout or the portal: what Stripe changed shows at once (banner included).
  useEffect(() => {
    void queryClient.invalidateQueries({ queryKey: billingKeys.all(shopId) });
  }, [queryClient, shopId, checkout]);

  if (!membership || !me) return null;
  if (!canRead) return <OwnerOnly shopId={shopId} shopName={membership.shopName} title="Billing" />;
  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="Billing" description="Your plan and subscription. Payments are handled by Stripe; Tappet never sees card numbers." />
      <BillingScreen shopId={shopId} returned={checkout === 'done' ? 'done' : checkout === 'cancelled' ? 'cancelled' : null} />
    </>
  );
}
