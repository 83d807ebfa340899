import {
  binSchema,
  holdSchema,
  movementWriteResponseSchema,
  type Bin,
  type BinInput,
  type BinUpdate,
  type Hold,
  type HoldInput,
  type MovementWriteResponse,
  type StockAdjustmentInput,
  type StockCountInput,
  type StockIssueInput,
  type StockMoveInput,
  type StockReceiptInput,
  type StockReturnInput,
} from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { stockApi, stockKey } from './keys';

// The stock writes, one function per endpoint. Every write changes quantities that stock screens,
// the part page and lookup results show, so each success refreshes the stock and lookup caches.

export const receiveStock = (shopId: string, input: StockReceiptInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/receipts`, input, { schema: movementWriteResponseSchema });
export const issueStock = (shopId: string, input: StockIssueInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/issues`, input, { schema: movementWriteResponseSchema });
export const returnStock = (shopId: string, input: StockReturnInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/returns`, input, { schema: movementWriteResponseSchema });
export const adjustStock = (shopId: string, input: StockAdjustmentInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/adjustments`, input, { schema: movementWriteResponseSchema });
export const moveStock = (shopId: string, input: StockMoveInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/moves`, input, { schema: movementWriteResponseSchema });
export const countStock = (shopId: string, input: StockCountInput) => api.post<MovementWriteResponse>(`${stockApi(shopId)}/counts`, input, { schema: movementWriteResponseSchema });
export const holdStock = (shopId: string, input: HoldInput) => api.post<Hold>(`${stockApi(shopId)}/holds`, input, { schema: holdSchema });
export const releaseHold = (shopId: string, holdId: string) => api.post<Hold>(`${stockApi(shopId)}/holds/${encodeURIComponent(holdId)}/release`, undefined, { schema: holdSchema });
export const createBin = (shopId: string, input: BinInput) => api.post<Bin>(`${stockApi(shopId)}/bins`, input, { schema: binSchema });
export const updateBin = (shopId: string, binId: string, input: BinUpdate) => api.patch<Bin>(`${stockApi(shopId)}/bins/${encodeURIComponent(binId)}`, input, { schema: binSchema });

/** A stock mutation that refreshes every stock query and the lookup of the shop when it succeeds. */
export function useStockMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => write(shopId, input),
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: stockKey(shopId) }), queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'catalogue', 'lookup') })]);
    },
  });
}
