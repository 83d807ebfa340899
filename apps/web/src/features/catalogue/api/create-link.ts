import { linkSchema, type linkInputSchema, type PartLink } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

export type LinkInput = z.input<typeof linkInputSchema>;

/** POST /api/shops/:shopId/part-links: links two parts (or a part to a number not in the catalogue). */
export function createLink(shopId: string, input: LinkInput): Promise<PartLink> {
  return api.post(`${shopApi(shopId)}/part-links`, input, { schema: linkSchema });
}

/** Links change the lineage of every part they touch, so the whole catalogue cache refreshes. */
export function useCreateLink(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LinkInput) => createLink(shopId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
