import { EmptyState } from '@tappet/ui';
import { useParams } from 'react-router-dom';
import { CounterSale } from '../../../../../features/sales/components/counter-sale';
import { useCan } from '../../../../../lib/ability';
import { useSettings } from '../../../../../lib/shop-settings';
import { SalesPage } from './sales-page';

/** Selling parts over the counter. */
export default function CounterRoute() {
  const { shopId = '' } = useParams();
  const settings = useSettings(shopId);
  const canSell = useCan('create', 'Invoice', { shopId });
  return (
    <SalesPage shopId={shopId} title="Counter sale" description="The stock is issued and the invoice issued together when the sale is completed.">
      {canSell ? <CounterSale shopId={shopId} currency={settings.data?.currency ?? 'GBP'} /> : <EmptyState title="Only the owner sells over the counter">Ask the owner to make the sale.</EmptyState>}
    </SalesPage>
  );
}
