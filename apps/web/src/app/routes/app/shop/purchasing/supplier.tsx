import { useParams } from 'react-router-dom';
import { useSuppliers } from '../../../../../features/purchasing/api/get-suppliers';
import { SupplierDetail } from '../../../../../features/purchasing/components/supplier-detail';
import { PurchasingPage } from './purchasing-page';

/** One supplier with its listings. */
export default function SupplierRoute() {
  const { shopId = '', supplierId = '' } = useParams();
  const name = useSuppliers(shopId).data?.suppliers.find((s) => s.id === supplierId)?.name;
  return (
    <PurchasingPage shopId={shopId} title={name ?? 'Supplier'}>
      <SupplierDetail shopId={shopId} supplierId={supplierId} />
    </PurchasingPage>
  );
}
