import { z } from 'zod';
import { emailSchema, idSchema } from './common';
import { shopRoleSchema } from './roles';

/** OWASP ASVS 6.2: at least 8 characters, at least 64 allowed (we allow 128). */
export const passwordSchema = z
  .string()
  .min(8, 'Use at least 8 characters.')
  .max(128, 'Use at most 128 characters.');

export const signInRequestSchema = z
  .object({
    email: emailSchema,
    password: z.string().min(1, 'Enter your password.').max(128, 'Use at most 128 characters.'),
  })
  .strict();
export type SignInRequest = z.infer<typeof signInRequestSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema }).strict();
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetConfirmSchema = z
  .object({
    token: z.string().min(20).max(200),
    password: passwordSchema,
  })
  .strict();
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirmSchema>;

export const membershipSchema = z.object({
  shopId: idSchema,
  shopName: z.string(),
  role: shopRoleSchema,
  /** Spending limit for purchase orders in the shop's minor currency units; null = no limit set. */
  spendingLimitMinor: z.number().int().nullable(),
  /** The shop is suspended or cancelled: everything reads, nothing writes (issue 11). */
  readOnly: z.boolean().optional(),
  /**
   * Set only on a platform admin's entry for a shop whose owner granted support access: when the
   * grant ends. Such an entry is not a membership; it acts as owner minus staff, keys and billing.
   */
  supportUntil: z.string().nullable().optional(),
});
export type Membership = z.infer<typeof membershipSchema>;

export const meResponseSchema = z.object({
  user: z.object({
    id: idSchema,
    email: z.string(),
    name: z.string(),
    isPlatformAdmin: z.boolean(),
  }),
  memberships: z.array(membershipSchema),
});
export type MeResponse = z.infer<typeof meResponseSchema>;

/** The me payload plus the session's active shop (the one `/` opens). */
export const meWithActiveShopSchema = meResponseSchema.extend({ activeShopId: idSchema.nullable() });
export type MeWithActiveShop = z.infer<typeof meWithActiveShopSchema>;

export const okResponseSchema = z.object({ ok: z.literal(true) });
export type OkResponse = z.infer<typeof okResponseSchema>;
