import { useMutation, useQueryClient } from '@tanstack/react-query';
import { shopQueryKey } from '../../../lib/query-client';
import { salesKey } from './keys';

/**
 * A sales mutation that refreshes the shop's sales (and stock) queries when it succeeds. A module
 * of its own, without the contract schemas, so that the part page's price panel loads no zod
 * (docs/decisions/029-part-panels-without-zod.md).
 */
export function useSalesMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => write(shopId, input),
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: salesKey(shopId) }), queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'stock') })]);
    },
  });
}
