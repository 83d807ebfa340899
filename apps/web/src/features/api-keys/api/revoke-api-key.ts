import { apiKeySummarySchema, type ApiKeySummary } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { apiKeysKey } from './get-api-keys';

/** POST /api/shops/:shopId/api-keys/:id/revoke: the key stops working at once. */
export function revokeApiKey(shopId: string, apiKeyId: string): Promise<ApiKeySummary> {
  return api.post(`/shops/${encodeURIComponent(shopId)}/api-keys/${encodeURIComponent(apiKeyId)}/revoke`, {}, { schema: apiKeySummarySchema });
}

export function useRevokeApiKey(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (apiKeyId: string) => revokeApiKey(shopId, apiKeyId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: apiKeysKey(shopId) }),
  });
}
