import { useParams } from 'react-router-dom';
import { useOrder } from '../../../../../features/purchasing/api/get-order';
import { OrderDetail } from '../../../../../features/purchasing/components/order-detail';
import { PurchasingPage } from './purchasing-page';

/** One purchase order: lines, receipts and what can be done with it now. */
export default function OrderRoute() {
  const { shopId = '', orderId = '' } = useParams();
  const order = useOrder(shopId, orderId);
  return (
    <PurchasingPage shopId={shopId} title={order.data ? `Purchase order ${order.data.reference}` : 'Purchase order'}>
      <OrderDetail shopId={shopId} orderId={orderId} />
    </PurchasingPage>
  );
}
