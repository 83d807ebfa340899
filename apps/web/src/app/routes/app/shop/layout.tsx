import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { ErrorState } from '@tappet/ui';
import { useEffect } from 'react';
import { data, isRouteErrorResponse, Outlet, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { NotFoundContent } from '../../../../components/errors/not-found';
import { useSetActiveShop } from '../../../../features/shops/api/set-active-shop';
import { BillingNotice } from '../../../../features/billing/components/billing-notice';
import { meQueryOptions, useMe } from '../../../../lib/auth';
import { clearShopCaches } from '../../../../lib/query-client';

/** A shop the person does not belong to is "not found", never a hint that it exists. */
export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (!me || !me.memberships.some((m) => m.shopId === params.shopId)) throw data('Shop not found', { status: 404 });
    return null;
  };

export default function ShopLayoutRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const queryClient = useQueryClient();
  const setActive = useSetActiveShop();
  const { mutate } = setActive;
  const activeShopId = me?.activeShopId;

  // Data of any other shop must never show here (query keys start with the shop id).
  useEffect(() => clearShopCaches(queryClient, shopId), [queryClient, shopId]);

  // Opened by URL (bookmark, back button): make it the session's active shop as well.
  useEffect(() => {
    if (activeShopId !== undefined && activeShopId !== shopId) mutate(shopId);
  }, [activeShopId, shopId, mutate]);

  return (
    <>
      <BillingNotice shopId={shopId} />
      <Outlet />
    </>
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
