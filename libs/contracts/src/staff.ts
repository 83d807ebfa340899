import { z } from 'zod';
import { passwordSchema } from './auth';
import { emailSchema, idSchema, shopIdParamsSchema } from './common';
import { shopRoleSchema } from './roles';

/** Spending limits are whole minor currency units (pence, cents). */
export const spendingLimitMinorSchema = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(100_000_000_000, 'That amount is too large.');

/** One person's standing in the shop, as the staff screen shows it. */
export const staffMemberSchema = z.object({
  membershipId: idSchema,
  userId: idSchema,
  name: z.string(),
  email: z.string(),
  role: shopRoleSchema,
  spendingLimitMinor: z.number().int().nullable(),
  isActive: z.boolean(),
  joinedAt: z.string(),
});
export type StaffMember = z.infer<typeof staffMemberSchema>;

/** An invitation that has not been accepted or withdrawn (it may have expired). */
export const invitationSummarySchema = z.object({
  id: idSchema,
  email: z.string(),
  role: shopRoleSchema,
  spendingLimitMinor: z.number().int().nullable(),
  invitedByName: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
  expired: z.boolean(),
});
export type InvitationSummary = z.infer<typeof invitationSummarySchema>;

export const staffListResponseSchema = z.object({
  members: z.array(staffMemberSchema),
  invitations: z.array(invitationSummarySchema),
});
export type StaffListResponse = z.infer<typeof staffListResponseSchema>;

export const createInvitationRequestSchema = z
  .object({
    email: emailSchema,
    role: shopRoleSchema,
    /** Only meaningful for buyers; ignored (stored as null) for other roles. */
    spendingLimitMinor: spendingLimitMinorSchema.nullable().optional(),
  })
  .strict();
export type CreateInvitationRequest = z.infer<typeof createInvitationRequestSchema>;

export const invitationParamsSchema = shopIdParamsSchema.extend({ invitationId: idSchema }).strict();
export const membershipParamsSchema = shopIdParamsSchema.extend({ membershipId: idSchema }).strict();

export const updateMemberRoleRequestSchema = z.object({ role: shopRoleSchema }).strict();
export type UpdateMemberRoleRequest = z.infer<typeof updateMemberRoleRequestSchema>;

export const updateSpendingLimitRequestSchema = z.object({ spendingLimitMinor: spendingLimitMinorSchema.nullable() }).strict();
export type UpdateSpendingLimitRequest = z.infer<typeof updateSpendingLimitRequestSchema>;

/** Invitation tokens are 32 random bytes in base64url (43 characters). */
export const invitationTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{20,200}$/, 'This invitation link is not valid.');

export const invitationTokenParamsSchema = z.object({ token: invitationTokenSchema }).strict();

/** What the accept page shows before the person sets a name and password. */
export const publicInvitationSchema = z.object({
  shopName: z.string(),
  email: z.string(),
  role: shopRoleSchema,
  expiresAt: z.string(),
  /** True when the address already has an account: the person signs in instead of choosing a password. */
  accountExists: z.boolean(),
});
export type PublicInvitation = z.infer<typeof publicInvitationSchema>;

/**
 * Accepting: a new account sends name and password; an existing account (signed in as the invited
 * address) sends neither.
 */
export const acceptInvitationRequestSchema = z
  .object({
    token: invitationTokenSchema,
    name: z.string().trim().min(1, 'Enter your name.').max(200, 'Use at most 200 characters.').optional(),
    password: passwordSchema.optional(),
  })
  .strict();
export type AcceptInvitationRequest = z.infer<typeof acceptInvitationRequestSchema>;
