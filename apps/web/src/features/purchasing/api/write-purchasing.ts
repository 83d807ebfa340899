import {
  listingImportResultSchema,
  listingSchema,
  type Listing,
  ordersFromReorderResponseSchema,
  purchaseOrderSchema,
  sendOrderResponseSchema,
  supplierReturnSchema,
  supplierSchema,
  type ListingImportResult,
  type PurchaseOrder,
  type Supplier,
  type SupplierReturn,
} from '@tappet/contracts';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { purchasingApi } from './keys';

// The purchasing writes, one function per endpoint (a part's buying choices: get-part-purchasing.ts).
// Run through usePurchasingMutation (purchasing-mutation.ts), each success refreshes every
// purchasing query of the shop, and the stock queries: receipts and returns move stock.

const order = (shopId: string, orderId: string) => `${purchasingApi(shopId)}/orders/${encodeURIComponent(orderId)}`;

export const createSupplier = (shopId: string, input: Record<string, unknown>) => api.post<Supplier>(`${purchasingApi(shopId)}/suppliers`, input, { schema: supplierSchema });
export const draftFromReorder = (shopId: string, input: { partIds: string[]; specialOrderIds: string[] }) =>
  api.post<z.infer<typeof ordersFromReorderResponseSchema>>(`${purchasingApi(shopId)}/orders/from-reorder`, input, { schema: ordersFromReorderResponseSchema });
export const updateSupplier = (shopId: string, input: { supplierId: string; body: Record<string, unknown> }) =>
  api.patch<Supplier>(`${purchasingApi(shopId)}/suppliers/${encodeURIComponent(input.supplierId)}`, input.body, { schema: supplierSchema });
export const updateListing = (shopId: string, input: { listingId: string; body: Record<string, unknown> }) =>
  api.patch<Listing>(`${purchasingApi(shopId)}/listings/${encodeURIComponent(input.listingId)}`, input.body, { schema: listingSchema });
export const deleteListing = (shopId: string, listingId: string) => api.delete<void>(`${purchasingApi(shopId)}/listings/${encodeURIComponent(listingId)}`);
export const updateOrder = (shopId: string, input: { orderId: string; body: Record<string, unknown> }) => api.patch<PurchaseOrder>(order(shopId, input.orderId), input.body, { schema: purchaseOrderSchema });
export const requestApproval = (shopId: string, orderId: string) => api.post<PurchaseOrder>(`${order(shopId, orderId)}/request-approval`, undefined, { schema: purchaseOrderSchema });
export const approveOrder = (shopId: string, orderId: string) => api.post<PurchaseOrder>(`${order(shopId, orderId)}/approve`, undefined, { schema: purchaseOrderSchema });
export const rejectOrder = (shopId: string, input: { orderId: string; reason: string }) => api.post<PurchaseOrder>(`${order(shopId, input.orderId)}/reject`, { reason: input.reason }, { schema: purchaseOrderSchema });
export const sendOrder = (shopId: string, orderId: string) => api.post<z.infer<typeof sendOrderResponseSchema>>(`${order(shopId, orderId)}/send`, undefined, { schema: sendOrderResponseSchema });
export const cancelOrder = (shopId: string, input: { orderId: string; reason: string }) => api.post<PurchaseOrder>(`${order(shopId, input.orderId)}/cancel`, { reason: input.reason }, { schema: purchaseOrderSchema });
export const closeBackOrder = (shopId: string, input: { orderId: string; reason: string }) => api.post<PurchaseOrder>(`${order(shopId, input.orderId)}/close`, { reason: input.reason }, { schema: purchaseOrderSchema });
export const receiveOrder = (shopId: string, input: { orderId: string; lines: Array<{ lineId: string; quantity: number; binId: string; unitPriceMinor?: number }> }) =>
  api.post<PurchaseOrder>(`${order(shopId, input.orderId)}/receipts`, { lines: input.lines }, { schema: purchaseOrderSchema });
export const creditReturn = (shopId: string, input: { returnId: string; creditedMinor: number; creditReference: string | null }) =>
  api.post<SupplierReturn>(`${purchasingApi(shopId)}/returns/${encodeURIComponent(input.returnId)}/credit`, { creditedMinor: input.creditedMinor, creditReference: input.creditReference }, { schema: supplierReturnSchema });
export const importListings = (shopId: string, input: { mode: 'preview' | 'commit'; file: File }) => {
  const form = new FormData();
  form.set('mode', input.mode);
  form.set('file', input.file);
  return api.post<ListingImportResult>(`${purchasingApi(shopId)}/listings/import`, form, { schema: listingImportResultSchema });
};

export const createListing = (shopId: string, input: { supplierId: string; body: Record<string, unknown> }) =>
  api.post<Listing>(`${purchasingApi(shopId)}/suppliers/${encodeURIComponent(input.supplierId)}/listings`, input.body, { schema: listingSchema });
export const createOrder = (shopId: string, input: Record<string, unknown>) => api.post<PurchaseOrder>(`${purchasingApi(shopId)}/orders`, input, { schema: purchaseOrderSchema });
export const createReturn = (shopId: string, input: Record<string, unknown>) => api.post<SupplierReturn>(`${purchasingApi(shopId)}/returns`, input, { schema: supplierReturnSchema });
