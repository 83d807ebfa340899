import { fitmentSchema, type Fitment, type fitmentInputSchema } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

export type FitmentInput = z.input<typeof fitmentInputSchema>;

/** POST /api/shops/:shopId/fitments: what a part fits. */
export function createFitment(shopId: string, input: FitmentInput): Promise<Fitment> {
  return api.post(`${shopApi(shopId)}/fitments`, input, { schema: fitmentSchema });
}

export function useCreateFitment(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FitmentInput) => createFitment(shopId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) }),
  });
}
