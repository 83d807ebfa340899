import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { ErrorState } from '@tappet/ui';
import { useEffect } from 'react';
import { data, isRouteErrorResponse, Outlet, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { NotFoundContent } from '../../../../components/errors/not-found';
import { useSetActiveShop } from '../../../../features/shops/api/set-active-shop';
import { billingStatusQueryOptions } from '../../../../features/billing/api/get-billing-status';
import { BillingNotice } from '../../../../features/billing/components/billing-notice';
import { meQueryOptions, useMe } from '../../../../lib/auth';
import { clearShopCaches } from '../../../../lib/query-client';
import { formatDateTime } from '../../../../lib/dates';

/** A shop the person does not belong to is "not found", never a hint that it exists. */
export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    let me = await queryClient.ensureQueryData(meQueryOptions());
    // A platform admin may have been granted support access since /api/me was last read.
    if (me?.user.isPlatformAdmin && !me.memberships.some((m) => m.shopId === params.shopId)) me = await queryClient.fetchQuery(meQueryOptions());
    if (!me || !me.memberships.some((m) => m.shopId === params.shopId)) throw data('Shop not found', { status: 404 });
    // The billing notice's status, asked for now beside the screen's own code rather than after
    // the first render: one round trip fewer before the first screen (decision 026).
    void queryClient.prefetchQuery(billingStatusQueryOptions(params.shopId ?? ''));
    return null;
  };

export default function ShopLayoutRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const queryClient = useQueryClient();
  const setActive = useSetActiveShop();
  const { mutate } = setActive;
  const activeShopId = me?.activeShopId;
  const entry = me?.memberships.find((m) => m.shopId === shopId);
  const supportUntil = entry?.supportUntil ?? null;

  // Data of any other shop must never show here (query keys start with the shop id).
  useEffect(() => clearShopCaches(queryClient, shopId), [queryClient, shopId]);

  // Opened by URL (bookmark, back button): make it the session's active shop as well.
  useEffect(() => {
    // Support access is not a membership, so it never becomes the session's active shop.
    if (activeShopId !== undefined && activeShopId !== shopId && !supportUntil) mutate(shopId);
  }, [activeShopId, shopId, mutate, supportUntil]);

  return (
    <>
      {supportUntil && <SupportAccessNotice shopName={entry?.shopName ?? ''} until={supportUntil} />}
      <BillingNotice shopId={shopId} />
      <Outlet />
    </>
  );
}

/** Shown to a platform admin inside a shop whose owner granted support access. */
function SupportAccessNotice({ shopName, until }: { shopName: string; until: string }) {
  return (
    <section aria-label="Support access" className="mb-5 flex flex-wrap items-start gap-3 rounded-md border-2 border-advise bg-advise-soft p-4 text-ink">
      <div className="flex min-w-0 flex-1 flex-col gap-1">
        <h2 className="font-bold">Support access to {shopName}</h2>
        <p className="max-w-prose">
          Its owner granted access until <time dateTime={until}>{formatDateTime((until))}</time>. Everything you open or change here is
          recorded and shown to the owner. Staff, API keys and billing stay with the shop.
        </p>
      </div>
    </section>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundContent what="shop" />;
  return (
    <ErrorState
      message="This shop's page could not be shown. Reload to try again."
      onRetry={() => window.location.reload()}
    />
  );
}
