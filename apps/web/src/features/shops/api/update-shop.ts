import { shopDetailSchema, updateShopRequestSchema, type ShopDetail, type UpdateShopRequest } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meQueryKey } from '../../../lib/auth';
import { shopQueryKey } from '../../../lib/query-client';

/** The rename request: the API's own schema, from the contracts. */
export const updateShopSchema = updateShopRequestSchema;
export type UpdateShopInput = UpdateShopRequest;

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
