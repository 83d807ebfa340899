import { templateListResponseSchema, type TemplateListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** GET /api/shops/:shopId/checklist-templates (a new shop gets Tappet's two). */
export function getTemplates(shopId: string, signal?: AbortSignal): Promise<TemplateListResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/checklist-templates`, { schema: templateListResponseSchema, signal });
}

export function templatesQueryOptions(shopId: string) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'checklist-templates'), queryFn: ({ signal }) => getTemplates(shopId, signal), staleTime: 60_000 });
}

export function useTemplates(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...templatesQueryOptions(shopId), enabled: options.enabled ?? true });
}
