import type { QueryClient } from '@tanstack/react-query';
import { EmptyState, ErrorState, LoadingState, Panel } from '@tappet/ui';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../components/layouts/page-header';
import { paths } from '../../../../config/paths';
import { settingsQueryOptions, useSettings } from '../../../../features/settings/api/get-settings';
import { ExportPanel } from '../../../../features/settings/components/export-panel';
import { SettingsForm } from '../../../../features/settings/components/settings-form';
import { shopQueryOptions, useShop } from '../../../../features/shops/api/get-shop';
import { ShopDetails } from '../../../../features/shops/components/shop-details';
import { abilityFor, canOn, useCan } from '../../../../lib/ability';
import { errorMessage } from '../../../../lib/api-client';
import { meQueryOptions, useMe } from '../../../../lib/auth';
import { useDocumentTitle } from '../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'update', 'Settings', { shopId: params.shopId })) {
      void queryClient.prefetchQuery(settingsQueryOptions(params.shopId));
      void queryClient.prefetchQuery(shopQueryOptions(params.shopId));
    }
    return null;
  };

/** The Shop page (owners): the shop's record, every setting, and the whole-shop export. */
export default function ShopSettingsRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canManage = useCan('update', 'Settings', { shopId });
  const canExport = useCan('export', 'ShopExport', { shopId });
  const settings = useSettings(shopId, { enabled: canManage });
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
      <PageHeader eyebrow={membership.shopName} title="Shop" description="The shop’s settings, its record on Tappet, and a copy of all its data." />
      <div className="flex flex-col gap-8">
        <section aria-labelledby="settings-title" className="flex flex-col gap-4">
          <h2 id="settings-title" className="text-lg font-bold">
            Settings
          </h2>
          {settings.isPending ? (
            <LoadingState label="Loading the settings…" />
          ) : settings.isError ? (
            <ErrorState message={errorMessage(settings.error)} onRetry={() => void settings.refetch()} />
          ) : (
            <SettingsForm shopId={shopId} settings={settings.data} />
          )}
        </section>
        {canExport && (
          <Panel title="Download everything" id="export-title">
            <ExportPanel shopId={shopId} />
          </Panel>
        )}
        <Panel title="On Tappet" id="details-title">
          {shop.isPending ? (
            <LoadingState label="Loading the shop…" />
          ) : shop.isError ? (
            <ErrorState message={errorMessage(shop.error)} onRetry={() => void shop.refetch()} />
          ) : (
            <ShopDetails shop={shop.data} />
          )}
        </Panel>
      </div>
    </>
  );
}
