import type { QueryClient } from '@tanstack/react-query';
import { ErrorState, LoadingState, Panel } from '@tappet/ui';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../components/layouts/page-header';
import { RoleWelcome } from '../../../../features/home/components/role-welcome';
import { shopQueryOptions, useShop } from '../../../../features/shops/api/get-shop';
import { ShopNameForm } from '../../../../features/shops/components/shop-name-form';
import { useCan } from '../../../../lib/ability';
import { errorMessage } from '../../../../lib/api-client';
import { useMe } from '../../../../lib/auth';
import { useDocumentTitle } from '../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    // Warm the cache; a failure is shown by the page itself.
    if (params.shopId) await queryClient.prefetchQuery(shopQueryOptions(params.shopId));
    return null;
  };

/** The shop's home: who you are here and what you can do; owners can rename the shop. */
export default function ShopHomeRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canRename = useCan('update', 'Shop', { shopId });
  const shop = useShop(shopId);
  useDocumentTitle(membership ? `${membership.shopName} · Home` : 'Home');

  if (!me || !membership) return null;
  const firstName = me.user.name.split(/\s+/)[0] || me.user.name;

  return (
    <>
      <PageHeader eyebrow="Home" title={membership.shopName} />
      <div className="flex flex-col gap-6">
        <RoleWelcome firstName={firstName} membership={membership} shopCount={me.memberships.length} />
        {canRename && (
          <Panel title="Rename the shop" id="rename-title">
            {shop.isPending ? (
              <LoadingState label="Loading the shop…" />
            ) : shop.isError ? (
              <ErrorState message={errorMessage(shop.error)} onRetry={() => void shop.refetch()} />
            ) : (
              <ShopNameForm shopId={shopId} currentName={shop.data.name} />
            )}
          </Panel>
        )}
      </div>
    </>
  );
}
