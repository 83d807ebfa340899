import { supportAccessResponseSchema, supportGrantSchema, type GrantSupportAccessRequest, type SupportAccessResponse, type SupportGrantView } from '@tappet/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { billingKeys } from './keys';

const base = (shopId: string) => `/shops/${encodeURIComponent(shopId)}/support-access`;

/** GET /api/shops/:shopId/support-access: grants and what support did (owners). */
export function getSupportAccess(shopId: string, signal?: AbortSignal): Promise<SupportAccessResponse> {
  return api.get(base(shopId), { schema: supportAccessResponseSchema, signal });
}

export function supportAccessQueryOptions(shopId: string) {
  return queryOptions({ queryKey: billingKeys.supportAccess(shopId), queryFn: ({ signal }) => getSupportAccess(shopId, signal) });
}

export function useSupportAccess(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...supportAccessQueryOptions(shopId), enabled: options.enabled ?? true });
}

/** POST …/support-access: lets platform support see the shop for some hours. */
export function useGrantSupportAccess(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: GrantSupportAccessRequest): Promise<SupportGrantView> => api.post(base(shopId), input, { schema: supportGrantSchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: billingKeys.supportAccess(shopId) }),
  });
}

/** DELETE …/support-access: ends it now. */
export function useRevokeSupportAccess(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(base(shopId)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: billingKeys.supportAccess(shopId) }),
  });
}
