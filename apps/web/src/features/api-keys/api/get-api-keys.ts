import { apiKeyListResponseSchema, type ApiKeySummary } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

export const apiKeysKey = (shopId: string) => shopQueryKey(shopId, 'api-keys');

/** GET /api/shops/:shopId/api-keys (owners): every key, revoked ones included. */
export async function getApiKeys(shopId: string, signal?: AbortSignal): Promise<ApiKeySummary[]> {
  const body = await api.get(`/shops/${encodeURIComponent(shopId)}/api-keys`, { schema: apiKeyListResponseSchema, signal });
  return body.keys;
}

export function apiKeysQueryOptions(shopId: string) {
  return queryOptions({ queryKey: apiKeysKey(shopId), queryFn: ({ signal }) => getApiKeys(shopId, signal) });
}

export function useApiKeys(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...apiKeysQueryOptions(shopId), enabled: options.enabled ?? true });
}
