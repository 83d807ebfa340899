import { resolveResponseSchema, type ResolveResponse } from '@tappet/contracts';
import { api } from '../../../lib/api-client';
import { searchOf } from './keys';

/** GET /api/shops/:shopId/lineage/resolve: the part a typed number (or supplier number) names; 404 when none. */
export function resolvePartNumber(shopId: string, number: string): Promise<ResolveResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/lineage/resolve${searchOf({ number })}`, { schema: resolveResponseSchema });
}
