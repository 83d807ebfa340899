import { shopDetailSchema, type ShopDetail } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { meQueryKey } from '../../../lib/auth';
import { shopQueryKey } from '../../../lib/query-client';

/**
 * The rename request, with the same rules as the API's schema. (That schema lives in apps/api for
 * now; when it moves to @tappet/contracts this one should be replaced by it.)
 */
export const updateShopSchema = z
  .object({
    name: z.string().trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
  })
  .strict();
export type UpdateShopInput = z.infer<typeof updateShopSchema>;

/** PATCH /api/shops/:shopId (owners only). */
export function updateShop(shopId: string, input: UpdateShopInput): Promise<ShopDetail> {
  return api.patch(`/shops/${encodeURIComponent(shopId)}`, input, { schema: shopDetailSchema });
}

/** Renames the shop, then refreshes the shop's details and the names in the shop switcher. */
export function useUpdateShop(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateShopInput) => updateShop(shopId, input),
    onSuccess: async (shop) => {
      queryClient.setQueryData(shopQueryKey(shopId, 'detail'), shop);
      await queryClient.invalidateQueries({ queryKey: meQueryKey });
    },
  });
}
