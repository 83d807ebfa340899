import { partSearchResponseSchema, type PartSearchResponse } from '@tappet/contracts';
import { api } from '../../../lib/api-client';

/** GET /api/shops/:shopId/parts/search (the lookup API): parts by number or words, with their stock per bin. */
export function searchParts(shopId: string, q: string, signal?: AbortSignal): Promise<PartSearchResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/parts/search?q=${encodeURIComponent(q)}&limit=10`, { schema: partSearchResponseSchema, signal });
}
