import { purchaseOrderSchema, type PurchaseOrder } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/orders/:orderId: the order with its lines and receipts. */
export function getOrder(shopId: string, orderId: string, signal?: AbortSignal): Promise<PurchaseOrder> {
  return api.get(`${purchasingApi(shopId)}/orders/${encodeURIComponent(orderId)}`, { schema: purchaseOrderSchema, signal });
}

export function orderQueryOptions(shopId: string, orderId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'order', orderId], queryFn: ({ signal }) => getOrder(shopId, orderId, signal) });
}

export function useOrder(shopId: string, orderId: string) {
  return useQuery(orderQueryOptions(shopId, orderId));
}

/** The URL of the order's PDF (opened in a new tab). */
export function orderPdfHref(shopId: string, orderId: string): string {
  return `/api${purchasingApi(shopId)}/orders/${encodeURIComponent(orderId)}/pdf`;
}
