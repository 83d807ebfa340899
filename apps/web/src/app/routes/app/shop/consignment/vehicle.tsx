import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../../../config/paths';
import { ConsignmentVehicleView } from '../../../../../features/consignment/components/consignment-vehicle';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** One consigned vehicle: terms, approved work, settlement, PDF and payout. */
export default function ConsignmentVehicleRoute() {
  const { shopId = '', vehicleId = '' } = useParams();
  useDocumentTitle('Consignment');
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm font-bold tracking-wide text-ink-muted uppercase">
        <Link to={paths.shop.consignment.getHref(shopId)} className="text-accent underline underline-offset-4">
          Consignment
        </Link>
      </nav>
      <ConsignmentVehicleView shopId={shopId} vehicleId={vehicleId} />
    </>
  );
}
