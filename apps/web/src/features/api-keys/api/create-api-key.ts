import { createApiKeyResponseSchema, type CreateApiKeyRequest, type CreateApiKeyResponse } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { apiKeysKey } from './get-api-keys';

/** POST /api/shops/:shopId/api-keys: the answer carries the secret, the only time it is ever shown. */
export function createApiKey(shopId: string, input: CreateApiKeyRequest): Promise<CreateApiKeyResponse> {
  return api.post(`/shops/${encodeURIComponent(shopId)}/api-keys`, input, { schema: createApiKeyResponseSchema });
}

export function useCreateApiKey(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateApiKeyRequest) => createApiKey(shopId, input),
    // Only the list is refreshed: the secret is never put in the cache.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: apiKeysKey(shopId) }),
  });
}
