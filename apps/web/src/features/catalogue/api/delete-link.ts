import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

/** DELETE /api/shops/:shopId/part-links/:linkId. */
export function deleteLink(shopId: string, linkId: string): Promise<void> {
  return api.delete(`${shopApi(shopId)}/part-links/${encodeURIComponent(linkId)}`);
}

export function useDeleteLink(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (linkId: string) => deleteLink(shopId, linkId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
