import { shopSettingsSchema, type ShopSettings, type UpdateShopSettingsRequest } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { meQueryKey } from '../../../lib/auth';
import { shopQueryKey } from '../../../lib/query-client';
import { settingsKey } from './get-settings';

const settingsResponseSchema = shopSettingsSchema.extend({ currency: z.string() });

/** PATCH /api/shops/:shopId/settings with the changed fields only. */
export function updateSettings(shopId: string, patch: UpdateShopSettingsRequest): Promise<ShopSettings> {
  return api.patch(`/shops/${encodeURIComponent(shopId)}/settings`, patch, { schema: settingsResponseSchema });
}

/** Saves settings; a new name also refreshes the shop's details and the names in the shop switcher. */
export function useUpdateSettings(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: UpdateShopSettingsRequest) => updateSettings(shopId, patch),
    onSuccess: async (settings, patch) => {
      queryClient.setQueryData(settingsKey(shopId), settings);
      if (patch.name !== undefined) {
        await Promise.all([
          queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'detail') }),
          queryClient.invalidateQueries({ queryKey: meQueryKey }),
        ]);
      }
    },
  });
}
