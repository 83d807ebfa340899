import { useParams } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { SalesReports } from '../../../../../features/sales-reports/components/sales-reports';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** Sales by period, gross margin (owners) and unpaid invoices by age. */
export default function SalesReportsRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  useDocumentTitle(shopName ? `${shopName} · Sales reports` : 'Sales reports');
  return (
    <>
      <PageHeader eyebrow={shopName} title="Sales reports" description="Issued invoices less credit notes, by the day they were issued." />
      <SalesReports shopId={shopId} />
    </>
  );
}
