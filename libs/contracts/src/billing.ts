import { z } from 'zod';
import { idSchema } from './common';

import { billingStates } from './constants/billing';

export * from './constants/billing';
export const billingStateSchema = z.enum(billingStates);

/** A limit: a whole number, or null for "no limit". */
const limitSchema = z.number().int().min(0).max(10_000_000).nullable();

export const planSchema = z.object({
  id: idSchema,
  name: z.string(),
  monthlyPriceMinor: z.number().int(),
  currency: z.string(),
  stripeLookupKey: z.string(),
  seatLimit: z.number().int().nullable(),
  catalogueLimit: z.number().int().nullable(),
  vehicleLimit: z.number().int().nullable(),
  isActive: z.boolean(),
});
export type PlanView = z.infer<typeof planSchema>;

export const planListResponseSchema = z.object({ plans: z.array(planSchema) });
export type PlanListResponse = z.infer<typeof planListResponseSchema>;

const planFields = {
  name: z.string().trim().min(2, 'Use at least 2 characters.').max(60, 'Use at most 60 characters.'),
  monthlyPriceMinor: z.number({ error: 'Enter the monthly price.' }).int('Enter the price in whole minor units (pence, cents).').min(0, 'The price cannot be negative.').max(10_000_000, 'That price is too high.'),
  currency: z
    .string()
    .trim()
    .regex(/^[A-Za-z]{3}$/, 'Use a three-letter currency code such as GBP.')
    .transform((s) => s.toLowerCase()),
  stripeLookupKey: z
    .string()
    .trim()
    .regex(/^[a-z0-9_.-]{3,100}$/, 'Use 3–100 lower-case letters, digits, dots, dashes or underscores.'),
  seatLimit: z.number().int().min(1, 'A plan needs at least one seat.').max(10_000).nullable(),
  catalogueLimit: limitSchema,
  vehicleLimit: limitSchema,
};

export const createPlanRequestSchema = z.object(planFields).strict();
export type CreatePlanRequest = z.infer<typeof createPlanRequestSchema>;

export const updatePlanRequestSchema = z
  .object({ ...planFields, isActive: z.boolean() })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');
export type UpdatePlanRequest = z.infer<typeof updatePlanRequestSchema>;

export const planParamsSchema = z.object({ planId: idSchema }).strict();

/** What every member of a shop may know: the state, and why the shop is read-only if it is. */
export const billingStatusSchema = z.object({
  state: billingStateSchema,
  readOnly: z.boolean(),
  /** A sentence naming why writing is refused, or null. */
  readOnlyReason: z.string().nullable(),
  trialEndsAt: z.string().nullable(),
  /** Days left in the trial, rounded up, or null outside the trial. */
  trialDaysLeft: z.number().int().nullable(),
  pastDueSince: z.string().nullable(),
  /** When a past-due shop becomes read-only if still unpaid. */
  suspendsAt: z.string().nullable(),
  /** True once the shop has paid through Stripe before, so the billing portal can take a payment. */
  canOpenPortal: z.boolean(),
  /** True while a platform admin has suspended the shop by hand (paying does not lift it). */
  suspendedByHand: z.boolean(),
});
export type BillingStatus = z.infer<typeof billingStatusSchema>;

export const planUsageSchema = z.object({
  seats: z.object({ used: z.number().int(), limit: z.number().int().nullable() }),
  catalogue: z.object({ used: z.number().int(), limit: z.number().int().nullable() }),
  vehicles: z.object({ used: z.number().int().nullable(), limit: z.number().int().nullable() }),
});
export type PlanUsage = z.infer<typeof planUsageSchema>;

/** The owner's billing page. */
export const billingOverviewSchema = z.object({
  status: billingStatusSchema,
  plan: planSchema.nullable(),
  plans: z.array(planSchema),
  usage: planUsageSchema,
  subscription: z.object({
    /** True once the shop has a Stripe customer, so the billing portal can open. */
    canOpenPortal: z.boolean(),
    /** True while a subscription is live (paying, trialling or being chased): plan changes go through the portal. */
    subscribed: z.boolean(),
    currentPeriodEnd: z.string().nullable(),
    cancelAtPeriodEnd: z.boolean(),
  }),
});
export type BillingOverview = z.infer<typeof billingOverviewSchema>;

export const checkoutRequestSchema = z.object({ planId: idSchema }).strict();
export type CheckoutRequest = z.infer<typeof checkoutRequestSchema>;

/** A hosted page (Stripe Checkout or billing portal) to send the browser to. */
export const redirectResponseSchema = z.object({ url: z.url() });
export type RedirectResponse = z.infer<typeof redirectResponseSchema>;

export const webhookResponseSchema = z.object({ received: z.literal(true), duplicate: z.boolean() });

// Support access: the owner lets platform support see the shop for a while.

export const grantSupportAccessRequestSchema = z
  .object({
    hours: z.number({ error: 'Choose how long support may look.' }).int().min(1, 'At least one hour.').max(168, 'At most 7 days (168 hours).'),
    note: z.string().trim().max(500, 'Use at most 500 characters.').optional(),
  })
  .strict();
export type GrantSupportAccessRequest = z.infer<typeof grantSupportAccessRequestSchema>;

export const supportGrantSchema = z.object({
  id: idSchema,
  grantedByName: z.string().nullable(),
  note: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
  revokedAt: z.string().nullable(),
  active: z.boolean(),
});
export type SupportGrantView = z.infer<typeof supportGrantSchema>;

export const supportActivitySchema = z.object({
  id: idSchema,
  at: z.string(),
  actorName: z.string().nullable(),
  action: z.string(),
  entity: z.string(),
  /** For a viewed page: method and path; for a change: the fields changed. */
  detail: z.string(),
});
export type SupportActivity = z.infer<typeof supportActivitySchema>;

export const supportAccessResponseSchema = z.object({
  current: supportGrantSchema.nullable(),
  grants: z.array(supportGrantSchema),
  activity: z.array(supportActivitySchema),
});
export type SupportAccessResponse = z.infer<typeof supportAccessResponseSchema>;
