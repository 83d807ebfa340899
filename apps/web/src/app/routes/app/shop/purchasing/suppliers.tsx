import { useParams } from 'react-router-dom';
import { SuppliersList } from '../../../../../features/purchasing/components/suppliers-list';
import { PurchasingPage } from './purchasing-page';

/** Suppliers and their listings. */
export default function SuppliersRoute() {
  const { shopId = '' } = useParams();
  return (
    <PurchasingPage shopId={shopId} title="Suppliers">
      <SuppliersList shopId={shopId} />
    </PurchasingPage>
  );
}
