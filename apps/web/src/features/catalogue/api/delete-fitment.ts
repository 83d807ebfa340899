import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

/** DELETE /api/shops/:shopId/fitments/:fitmentId. */
export function deleteFitment(shopId: string, fitmentId: string): Promise<void> {
  return api.delete(`${shopApi(shopId)}/fitments/${encodeURIComponent(fitmentId)}`);
}

export function useDeleteFitment(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (fitmentId: string) => deleteFitment(shopId, fitmentId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
