import { resolveResponseSchema } from '@tappet/contracts';
import { api, ApiError } from '../../../lib/api-client';

/** GET /api/shops/:shopId/lineage/resolve: the part a scanned or typed number names, or null when none. */
export async function resolveCode(shopId: string, code: string): Promise<{ id: string; number: string; description: string } | null> {
  try {
    const res = await api.get(`/shops/${encodeURIComponent(shopId)}/lineage/resolve?number=${encodeURIComponent(code)}`, { schema: resolveResponseSchema });
    return res.part ? { id: res.part.id, number: res.part.number, description: res.part.description } : null;
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) return null;
    throw error;
  }
}
