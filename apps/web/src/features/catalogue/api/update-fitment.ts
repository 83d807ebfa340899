import { fitmentSchema, type Fitment, type fitmentUpdateSchema } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

export type FitmentUpdate = z.input<typeof fitmentUpdateSchema>;

/** PATCH /api/shops/:shopId/fitments/:fitmentId. */
export function updateFitment(shopId: string, fitmentId: string, input: FitmentUpdate): Promise<Fitment> {
  return api.patch(`${shopApi(shopId)}/fitments/${encodeURIComponent(fitmentId)}`, input, { schema: fitmentSchema });
}

export function useUpdateFitment(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ fitmentId, input }: { fitmentId: string; input: FitmentUpdate }) => updateFitment(shopId, fitmentId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
