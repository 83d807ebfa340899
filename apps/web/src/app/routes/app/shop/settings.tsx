import type { QueryClient } from '@tanstack/react-query';
import { EmptyState, ErrorState, LoadingState } from '@tappet/ui';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../components/layouts/page-header';
import { paths } from '../../../../config/paths';
import { shopQueryOptions, useShop } from '../../../../features/shops/api/get-shop';
import { ShopDetails } from '../../../../features/shops/components/shop-details';
import { ShopNameForm } from '../../../../features/shops/components/shop-name-form';
import { useCan } from '../../../../lib/ability';
import { errorMessage } from '../../../../lib/api-client';
import { useMe } from '../../../../lib/auth';
import { useDocumentTitle } from '../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId) await queryClient.prefetchQuery(shopQueryOptions(params.shopId));
    return null;
  };

/** The Shop page (owners): the shop's record and its name. */
export default function ShopSettingsRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canManage = useCan('update', 'Shop', { shopId });
  const shop = useShop(shopId);
  useDocumentTitle(membership ? `${membership.shopName} · Shop` : 'Shop');

  if (!membership) return null;

  if (!canManage) {
    return (
      <>
        <PageHeader eyebrow={membership.shopName} title="Shop" />
        <EmptyState
          title="This page is for the shop’s owner"
          action={<Link to={paths.shop.home.getHref(shopId)}>Back to the shop’s home</Link>}
        >
          The owner changes the shop’s name and settings. Ask them if something here needs to change.
        </EmptyState>
      </>
    );
  }

  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="Shop" description="The shop’s record on Tappet and its name." />
      {shop.isPending ? (
        <LoadingState label="Loading the shop…" />
      ) : shop.isError ? (
        <ErrorState message={errorMessage(shop.error)} onRetry={() => void shop.refetch()} />
      ) : (
        <div className="flex flex-col gap-6">
          <section aria-labelledby="details-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
            <h2 id="details-title" className="text-lg font-bold">
              Details
            </h2>
            <ShopDetails shop={shop.data} />
          </section>
          <section aria-labelledby="rename-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
            <h2 id="rename-title" className="text-lg font-bold">
              Rename the shop
            </h2>
            <ShopNameForm shopId={shopId} currentName={shop.data.name} />
          </section>
        </div>
      )}
    </>
  );
}
