import { linkSchema, type linkUpdateSchema, type PartLink } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

export type LinkUpdate = z.input<typeof linkUpdateSchema>;

/** PATCH /api/shops/:shopId/part-links/:linkId: quantity, interchange, date, source and note. */
export function updateLink(shopId: string, linkId: string, input: LinkUpdate): Promise<PartLink> {
  return api.patch(`${shopApi(shopId)}/part-links/${encodeURIComponent(linkId)}`, input, { schema: linkSchema });
}

export function useUpdateLink(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ linkId, input }: { linkId: string; input: LinkUpdate }) => updateLink(shopId, linkId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
