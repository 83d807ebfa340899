import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateEstimate, Estimate, EstimateLineInput, SendEstimate } from '@tappet/contracts';
import { api } from '../../../lib/api-client';
import { estimatesApi, estimatesKey } from './keys';

const one = (shopId: string, estimateId: string) => `${estimatesApi(shopId)}/${encodeURIComponent(estimateId)}`;

export const createEstimate = (shopId: string, input: CreateEstimate) => api.post<Estimate>(estimatesApi(shopId), input);
export const updateEstimate = (shopId: string, input: { estimateId: string; note?: string | null; lines?: EstimateLineInput[] }) =>
  api.patch<Estimate>(one(shopId, input.estimateId), { ...(input.note !== undefined ? { note: input.note } : {}), ...(input.lines ? { lines: input.lines } : {}) });
export const sendEstimate = (shopId: string, input: { estimateId: string } & SendEstimate) => {
  const { estimateId, ...body } = input;
  return api.post<{ estimate: Estimate; emailed: boolean }>(`${one(shopId, estimateId)}/send`, body);
};
export const reviseEstimate = (shopId: string, estimateId: string) => api.post<Estimate>(`${one(shopId, estimateId)}/revise`);

/** An estimates mutation that refreshes the shop's estimate queries when it succeeds. */
export function useEstimatesMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => write(shopId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: estimatesKey(shopId) }),
  });
}
