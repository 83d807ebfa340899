import { z } from 'zod';
import { emailSchema, idSchema } from './common';
import { billingStateSchema, planSchema } from './billing';

export const platformShopListQuerySchema = z
  .object({
    q: z.string().trim().max(100).optional(),
    state: billingStateSchema.optional(),
    planId: idSchema.optional(),
  })
  .strict();
export type PlatformShopListQuery = z.infer<typeof platformShopListQuerySchema>;

export const platformShopSchema = z.object({
  id: idSchema,
  name: z.string(),
  slug: z.string(),
  plan: z.object({ id: idSchema, name: z.string() }).nullable(),
  billingState: billingStateSchema,
  manualSuspensionReason: z.string().nullable(),
  seatsUsed: z.number().int(),
  seatLimit: z.number().int().nullable(),
  catalogueSize: z.number().int(),
  catalogueLimit: z.number().int().nullable(),
  /** Last audited write in the shop. */
  lastActivityAt: z.string().nullable(),
  trialEndsAt: z.string().nullable(),
  /** End of the owner's support-access grant while one is active. */
  supportAccessUntil: z.string().nullable(),
  createdAt: z.string(),
});
export type PlatformShop = z.infer<typeof platformShopSchema>;

export const platformShopListResponseSchema = z.object({ shops: z.array(platformShopSchema), plans: z.array(planSchema) });
export type PlatformShopListResponse = z.infer<typeof platformShopListResponseSchema>;

export const onboardShopRequestSchema = z
  .object({
    name: z.string().trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
    planId: idSchema,
    ownerEmail: emailSchema,
  })
  .strict();
export type OnboardShopRequest = z.infer<typeof onboardShopRequestSchema>;

export const platformShopParamsSchema = z.object({ shopId: idSchema }).strict();

export const shopStateChangeRequestSchema = z
  .object({
    reason: z.string().trim().min(3, 'Give a reason of at least 3 characters.').max(500, 'Use at most 500 characters.'),
  })
  .strict();
export type ShopStateChangeRequest = z.infer<typeof shopStateChangeRequestSchema>;

export const shopStateChangeResponseSchema = z.object({ billingState: billingStateSchema });
