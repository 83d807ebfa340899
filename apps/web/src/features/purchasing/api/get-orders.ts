import { purchaseOrderListResponseSchema, type PurchaseOrderStatus } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

export type OrderList = z.infer<typeof purchaseOrderListResponseSchema>;
export type OrderSummary = OrderList['orders'][number];

/** What the orders list narrows by (null: any). */
export interface OrderFilters {
  status: PurchaseOrderStatus | null;
  supplierId: string | null;
}

const anyOrder: OrderFilters = { status: null, supplierId: null };

/** GET /api/shops/:shopId/purchasing/orders, optionally of one status and supplier: the newest (`truncated` when more match). */
export function getOrders(shopId: string, filters: OrderFilters, signal?: AbortSignal): Promise<OrderList> {
  const query = new URLSearchParams();
  if (filters.status) query.set('status', filters.status);
  if (filters.supplierId) query.set('supplierId', filters.supplierId);
  const search = query.toString();
  return api.get(`${purchasingApi(shopId)}/orders${search ? `?${search}` : ''}`, { schema: purchaseOrderListResponseSchema, signal });
}

export function ordersQueryOptions(shopId: string, filters: OrderFilters = anyOrder) {
  return queryOptions({
    queryKey: [...purchasingKey(shopId), 'orders', filters.status ?? 'all', filters.supplierId ?? 'all'],
    queryFn: ({ signal }) => getOrders(shopId, filters, signal),
  });
}

export function useOrders(shopId: string, filters: OrderFilters = anyOrder) {
  return useQuery(ordersQueryOptions(shopId, filters));
}
