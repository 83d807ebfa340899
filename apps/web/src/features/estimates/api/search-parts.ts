import { partSearchResponseSchema, type PartSearchResponse } from '@tappet/contracts';
import { api } from '../../../lib/api-client';

/** GET /api/shops/:shopId/parts/search (the lookup): parts by number or words, for an estimate line. */
export function searchParts(shopId: string, q: string, signal?: AbortSignal): Promise<PartSearchResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/parts/search?q=${encodeURIComponent(q)}&limit=8`, { schema: partSearchResponseSchema, signal });
}

/** GET /api/shops/:shopId/sales/sell-prices — what the pricing rules make of some parts. */
export function sellPrices(shopId: string, partIds: string[]): Promise<{ currency: string; prices: Array<{ partId: string; unitMinor: number | null; basis: string }> }> {
  const q = partIds.map((id) => `partIds=${encodeURIComponent(id)}`).join('&');
  return api.get(`/shops/${encodeURIComponent(shopId)}/sales/sell-prices?${q}`);
}
