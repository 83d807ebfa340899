import { countDetailSchema, countLineSchema, type CountDetail, type CountEntry, type CountLine, type CountStart } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { countsApi, countsKey } from './keys';

// The count writes, one function per endpoint. Posting moves stock, so every success refreshes the
// counts and the stock (and lookup) caches of the shop.

export const startCount = (shopId: string, input: CountStart) => api.post<CountDetail>(countsApi(shopId), input, { schema: countDetailSchema });
export const enterCount = (shopId: string, input: { countId: string; entry: CountEntry }) =>
  api.post<CountLine>(`${countsApi(shopId)}/${encodeURIComponent(input.countId)}/entries`, input.entry, { schema: countLineSchema });
export const postCount = (shopId: string, countId: string) => api.post<CountDetail>(`${countsApi(shopId)}/${encodeURIComponent(countId)}/post`, undefined, { schema: countDetailSchema });
export const abandonCount = (shopId: string, countId: string) => api.post<CountDetail>(`${countsApi(shopId)}/${encodeURIComponent(countId)}/abandon`, undefined, { schema: countDetailSchema });

/** A count mutation that refreshes the shop's counts, stock and lookup when it succeeds. */
export function useCountMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => write(shopId, input),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: countsKey(shopId) }),
        queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'stock') }),
        queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'lookup') }),
      ]);
    },
  });
}
