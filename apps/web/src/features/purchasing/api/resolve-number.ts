import { resolveResponseSchema, type ResolveResponse } from '@tappet/contracts';
import { api } from '../../../lib/api-client';

/** GET /api/shops/:shopId/lineage/resolve: the part a typed number (or supplier number) names, if any. */
export function resolveNumber(shopId: string, number: string): Promise<ResolveResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/lineage/resolve?number=${encodeURIComponent(number)}`, { schema: resolveResponseSchema });
}
