import { partSchema, type Part, type PartInput } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

/** POST /api/shops/:shopId/parts: adds a part (owner, buyer). */
export function createPart(shopId: string, input: PartInput): Promise<Part> {
  return api.post(`${shopApi(shopId)}/parts`, input, { schema: partSchema });
}

/** Adds a part, then refreshes the catalogue's lists. */
export function useCreatePart(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PartInput) => createPart(shopId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
