import { useParams } from 'react-router-dom';
import { OrdersList } from '../../../../../features/purchasing/components/orders-list';
import { PurchasingPage } from './purchasing-page';

/** Purchase orders in every state. */
export default function OrdersRoute() {
  const { shopId = '' } = useParams();
  return (
    <PurchasingPage shopId={shopId} title="Purchase orders">
      <OrdersList shopId={shopId} />
    </PurchasingPage>
  );
}
