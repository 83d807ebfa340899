import { ErrorState, LoadingState } from '@tappet/ui';
import { useParams } from 'react-router-dom';
import { useSalesSettings } from '../../../../../features/sales/api/sales-settings';
import { PricingSettings } from '../../../../../features/sales/components/pricing-settings';
import { useCan } from '../../../../../lib/ability';
import { errorMessage } from '../../../../../lib/api-client';
import { SalesPage } from './sales-page';

/** Pricing rules and tax settings of the shop. */
export default function PricingRoute() {
  const { shopId = '' } = useParams();
  const settings = useSalesSettings(shopId);
  const canEdit = useCan('update', 'Settings', { shopId });
  return (
    <SalesPage shopId={shopId} title="Pricing rules">
      {settings.isPending ? (
        <LoadingState label="Loading the pricing rules…" />
      ) : settings.isError ? (
        <ErrorState message={errorMessage(settings.error)} onRetry={() => void settings.refetch()} />
      ) : (
        <PricingSettings key={settings.data.updatedAt ?? 'new'} shopId={shopId} settings={settings.data} canEdit={canEdit} />
      )}
    </SalesPage>
  );
}
