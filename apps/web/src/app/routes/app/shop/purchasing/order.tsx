import { useParams } from 'react-router-dom';
import { PrintLabelsButton } from '../../../../../features/labels/components/print-labels-button';
import { useOrder } from '../../../../../features/purchasing/api/get-order';
import { OrderDetail } from '../../../../../features/purchasing/components/order-detail';
import { useCan } from '../../../../../lib/ability';
import { PurchasingPage } from './purchasing-page';

/** One purchase order: lines, receipts and what can be done with it now; labels for what arrived. */
export default function OrderRoute() {
  const { shopId = '', orderId = '' } = useParams();
  const order = useOrder(shopId, orderId);
  const canPrint = useCan('read', 'Part', { shopId });
  return (
    <PurchasingPage shopId={shopId} title={order.data ? `Purchase order ${order.data.reference}` : 'Purchase order'}>
      <OrderDetail
        shopId={shopId}
        orderId={orderId}
        labelsAction={
          canPrint
            ? (arrived) => (
                <PrintLabelsButton
                  shopId={shopId}
                  source={{ kind: 'receipts', receiptIds: arrived.flatMap((a) => a.receiptIds), parts: arrived.map((a) => ({ id: a.partId, number: a.partNumber, quantity: a.quantity })) }}
                  label="Print labels for what arrived"
                />
              )
            : undefined
        }
      />
    </PurchasingPage>
  );
}
