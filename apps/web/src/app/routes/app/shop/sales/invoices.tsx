import { useParams } from 'react-router-dom';
import { InvoicesList } from '../../../../../features/sales/components/invoices-list';
import { SalesPage } from './sales-page';

/** Invoices and credit notes of the shop. */
export default function InvoicesRoute() {
  const { shopId = '' } = useParams();
  return (
    <SalesPage shopId={shopId} title="Invoices" description="Drafts first, then the newest. Open one to issue it, take payment or credit it.">
      <InvoicesList shopId={shopId} />
    </SalesPage>
  );
}
