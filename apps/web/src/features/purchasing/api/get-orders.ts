import { purchaseOrderListResponseSchema, type PurchaseOrderStatus } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

export type OrderSummary = z.infer<typeof purchaseOrderListResponseSchema>['orders'][number];

/** GET /api/shops/:shopId/purchasing/orders, optionally of one status. */
export function getOrders(shopId: string, status: PurchaseOrderStatus | null, signal?: AbortSignal): Promise<{ orders: OrderSummary[] }> {
  return api.get(`${purchasingApi(shopId)}/orders${status ? `?status=${status}` : ''}`, { schema: purchaseOrderListResponseSchema, signal });
}

export function ordersQueryOptions(shopId: string, status: PurchaseOrderStatus | null = null) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'orders', status ?? 'all'], queryFn: ({ signal }) => getOrders(shopId, status, signal) });
}

export function useOrders(shopId: string, status: PurchaseOrderStatus | null = null) {
  return useQuery(ordersQueryOptions(shopId, status));
}
