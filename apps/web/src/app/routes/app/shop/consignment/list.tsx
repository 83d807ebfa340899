import { useParams } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { ConsignmentList } from '../../../../../features/consignment/components/consignment-list';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** Consigned vehicles: terms, sales and settlements with their owners. */
export default function ConsignmentListRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  useDocumentTitle(shopName ? `${shopName} · Consignment` : 'Consignment');
  return (
    <>
      <PageHeader eyebrow={shopName} title="Consignment" description="Vehicles sold for their owners: the commission agreed, the settlement after the sale, and the payout." />
      <ConsignmentList shopId={shopId} />
    </>
  );
}
