import { binListResponseSchema, valuationReportSchema } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { countsKey } from './keys';

/** What a count can cover: the bins in use (GET /stock/bins) and the categories with stock (GET /stock/valuation). */
export async function getCountChoices(shopId: string, signal?: AbortSignal): Promise<{ bins: Array<{ id: string; code: string; description: string | null; lineCount: number }>; categories: string[] }> {
  const base = `/shops/${encodeURIComponent(shopId)}/stock`;
  const [bins, value] = await Promise.all([api.get(`${base}/bins`, { schema: binListResponseSchema, signal }), api.get(`${base}/valuation`, { schema: valuationReportSchema, signal })]);
  return {
    bins: bins.bins.filter((b) => b.active).map((b) => ({ id: b.id, code: b.code, description: b.description, lineCount: b.lineCount })),
    categories: value.byCategory.map((c) => c.key).filter((k) => k !== 'Uncategorised').sort((a, b) => a.localeCompare(b)),
  };
}

export function countChoicesQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...countsKey(shopId), 'choices'], queryFn: ({ signal }) => getCountChoices(shopId, signal) });
}

export function useCountChoices(shopId: string, enabled = true) {
  return useQuery({ ...countChoicesQueryOptions(shopId), enabled });
}
