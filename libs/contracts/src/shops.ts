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
