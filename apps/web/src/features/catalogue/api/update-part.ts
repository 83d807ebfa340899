import { partSchema, type Part, type PartInput } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

/** PATCH /api/shops/:shopId/parts/:partId: changes the given fields of a part. */
export function updatePart(shopId: string, partId: string, input: Partial<PartInput>): Promise<Part> {
  return api.patch(`${shopApi(shopId)}/parts/${encodeURIComponent(partId)}`, input, { schema: partSchema });
}

/** Changes a part; its number may appear in other parts' lineage, so the whole catalogue refreshes. */
export function useUpdatePart(shopId: string, partId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<PartInput>) => updatePart(shopId, partId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
