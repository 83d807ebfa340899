import { z } from 'zod';
import { idSchema } from './common';
import { shopRoleSchema } from './roles';

export const shopSummarySchema = z.object({
  id: idSchema,
  name: z.string(),
  role: shopRoleSchema,
});
export type ShopSummary = z.infer<typeof shopSummarySchema>;

export const shopDetailSchema = z.object({
  id: idSchema,
  name: z.string(),
  slug: z.string(),
  createdAt: z.string(),
});
export type ShopDetail = z.infer<typeof shopDetailSchema>;

export const healthResponseSchema = z.object({ status: z.literal('ok') });

export const updateShopRequestSchema = z
  .object({
    name: z.string().trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
  })
  .strict();
export type UpdateShopRequest = z.infer<typeof updateShopRequestSchema>;

export const shopListResponseSchema = z.object({ shops: z.array(shopSummarySchema) });
export type ShopListResponse = z.infer<typeof shopListResponseSchema>;

export const setActiveShopRequestSchema = z.object({ shopId: idSchema }).strict();
export type SetActiveShopRequest = z.infer<typeof setActiveShopRequestSchema>;
