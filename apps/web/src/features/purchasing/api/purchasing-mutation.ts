import { useMutation, useQueryClient } from '@tanstack/react-query';
import { shopQueryKey } from '../../../lib/query-client';
import { purchasingKey } from './keys';

/**
 * A purchasing mutation that refreshes purchasing (and stock) queries of the shop when it succeeds.
 * A module of its own, without the contract schemas, so that the part page's purchasing panel
 * loads no zod (docs/decisions/029-part-panels-without-zod.md).
 */
export function usePurchasingMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => write(shopId, input),
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: purchasingKey(shopId) }), queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'stock') })]);
    },
  });
}
