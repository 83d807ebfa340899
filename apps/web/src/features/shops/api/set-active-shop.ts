import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meQueryKey, meSchema, type Me } from '../../../lib/auth';
import { clearShopCaches } from '../../../lib/query-client';

/** POST /api/me/active-shop: makes a shop the session's active one; answers with the me payload. */
export function setActiveShop(shopId: string): Promise<Me> {
  return api.post('/me/active-shop', { shopId }, { schema: meSchema });
}

/** Switches shop: tells the API, drops every other shop's cached data and updates me. */
export function useSetActiveShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setActiveShop,
    onSuccess: (me, shopId) => {
      clearShopCaches(queryClient, shopId);
      queryClient.setQueryData(meQueryKey, me);
    },
  });
}
