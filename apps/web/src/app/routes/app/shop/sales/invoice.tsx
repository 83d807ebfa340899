import { useParams, useSearchParams } from 'react-router-dom';
import { useInvoice } from '../../../../../features/sales/api/get-invoice';
import { InvoiceDetail } from '../../../../../features/sales/components/invoice-detail';
import { documentTitle } from '../../../../../features/sales/components/words';
import { useCan } from '../../../../../lib/ability';
import { SalesPage } from './sales-page';

/** One invoice or credit note. */
export default function InvoiceRoute() {
  const { shopId = '', invoiceId = '' } = useParams();
  const [search] = useSearchParams();
  const invoice = useInvoice(shopId, invoiceId);
  const can = {
    issue: useCan('issue', 'Invoice', { shopId }),
    pay: useCan('create', 'Payment', { shopId }),
    edit: useCan('update', 'Invoice', { shopId }),
    remove: useCan('delete', 'Invoice', { shopId }),
    email: useCan('send', 'Invoice', { shopId }),
  };
  return (
    <SalesPage shopId={shopId} title={invoice.data ? documentTitle(invoice.data) : 'Invoice'}>
      <InvoiceDetail key={invoiceId} shopId={shopId} invoiceId={invoiceId} can={can} cardReturn={search.get('paid') === 'card'} />
    </SalesPage>
  );
}
