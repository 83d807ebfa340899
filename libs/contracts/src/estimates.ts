import { z } from 'zod';
import { emailSchema, idSchema } from './common';

// Estimates (issue 12): what a job will cost the customer, sent as a PDF with a link where the
// customer approves or declines without an account. Money in integer minor units; quantities
// (parts, labour hours) as decimal text with up to 4 places.

export const estimateStatuses = ['draft', 'sent', 'approved', 'declined', 'superseded'] as const;
export type EstimateStatus = (typeof estimateStatuses)[number];
export const estimateLineKinds = ['part', 'labour', 'other'] as const;
export type EstimateLineKind = (typeof estimateLineKinds)[number];

const minor = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(1_000_000_000, 'That amount is too large.');
const taxPercent = z
  .number()
  .min(0, 'Use 0 to 100.')
  .max(100, 'Use 0 to 100.')
  .refine((n) => !String(n).includes('e') && (String(n).split('.')[1] ?? '').length <= 3, 'Use at most 3 decimal places.');
const quantity = z
  .union([z.string().trim(), z.number()])
  .transform((v) => String(v))
  .refine((s) => /^\d{1,6}(\.\d{1,4})?$/.test(s), 'Write the quantity as a number with up to 4 decimals.')
  .refine((s) => Number(s) > 0, 'The quantity must be more than 0.');

export const estimateLineInputSchema = z
  .object({
    kind: z.enum(estimateLineKinds, { error: 'Use part, labour or other.' }),
    /** A part from the catalogue (lookup); required for a part line. */
    partId: idSchema.nullable().default(null),
    description: z.string().trim().min(1, 'Describe the line.').max(200, 'Use at most 200 characters.'),
    /** Parts: how many; labour: hours (e.g. 2.5). */
    quantity,
    /** Leave out: a part takes its sell price, labour the shop's rate. */
    unitPriceMinor: minor.optional(),
    /** Leave out for the shop's standard rate. */
    taxRatePercent: taxPercent.optional(),
  })
  .strict()
  .refine((l) => l.kind !== 'part' || l.partId !== null, { message: 'Pick the part from the catalogue.', path: ['partId'] });
export type EstimateLineInput = z.input<typeof estimateLineInputSchema>;

const note = z.string().trim().max(1000, 'Use at most 1000 characters.').nullable();

export const createEstimateSchema = z
  .object({
    jobId: idSchema,
    note: note.default(null),
    lines: z.array(estimateLineInputSchema).max(200, 'Use at most 200 lines.').default([]),
  })
  .strict();
export type CreateEstimate = z.input<typeof createEstimateSchema>;

export const updateEstimateSchema = z
  .object({ note, lines: z.array(estimateLineInputSchema).max(200, 'Use at most 200 lines.') })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');
export type UpdateEstimate = z.input<typeof updateEstimateSchema>;

export const sendEstimateSchema = z
  .object({
    /** Leave out to use the customer's address on record. */
    email: emailSchema.optional(),
    /** Days the approval link stays valid (1–60). */
    linkValidDays: z.number().int('Whole days.').min(1, 'At least 1 day.').max(60, 'At most 60 days.').default(14),
  })
  .strict();
export type SendEstimate = z.input<typeof sendEstimateSchema>;

export const estimateListQuerySchema = z.object({ jobId: idSchema.optional() }).strict();
export const estimateIdParamsSchema = z.object({ shopId: idSchema, estimateId: idSchema }).strict();
export const estimateJobParamsSchema = z.object({ shopId: idSchema, jobId: idSchema }).strict();

/**
 * The opaque approval token from the e-mailed link: 32 random bytes, base64url. It travels in the
 * URL fragment of the page and in request bodies, never in a request path, so no log records it.
 */
export const approvalTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'This link is not valid.');
export const viewEstimateApprovalSchema = z.object({ token: approvalTokenSchema }).strict();
export const approveEstimateSchema = z
  .object({
    token: approvalTokenSchema,
    /** The version and total the customer saw, so nothing else is approved by accident. */
    version: z.number().int().min(1),
    grossMinor: minor,
    name: z.string().trim().min(1, 'Type your name.').max(120, 'Use at most 120 characters.'),
  })
  .strict();
export type ApproveEstimate = z.input<typeof approveEstimateSchema>;
export const declineEstimateSchema = z
  .object({ token: approvalTokenSchema, reason: z.string().trim().min(3, 'Tell the shop why (at least 3 characters).').max(1000, 'Use at most 1000 characters.') })
  .strict();
export type DeclineEstimate = z.input<typeof declineEstimateSchema>;

export interface EstimateLine {
  id: string;
  kind: EstimateLineKind;
  partId: string | null;
  partNumber: string | null;
  description: string;
  quantity: string;
  unitPriceMinor: number;
  /** Where a part's price came from (pricing rules) or 'typed'/'labour-rate'. */
  priceBasis: string;
  taxRatePercent: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
}

export interface Estimate {
  id: string;
  number: number;
  version: number;
  reference: string;
  jobId: string;
  jobNumber: number;
  jobTitle: string;
  vehicle: string;
  customerId: string | null;
  customerName: string | null;
  customerEmail: string | null;
  status: EstimateStatus;
  currency: string;
  taxRounding: 'per-line' | 'per-document';
  note: string | null;
  lines: EstimateLine[];
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  taxByRate: { ratePercent: number; netMinor: number; taxMinor: number }[];
  sentAt: string | null;
  sentTo: string | null;
  linkExpiresAt: string | null;
  decidedAt: string | null;
  decidedByName: string | null;
  approvedAmountMinor: number | null;
  declineReason: string | null;
  createdAt: string;
  updatedAt: string;
}

/** What the approval link shows the customer: no internal ids beyond what the page needs. */
export interface PublicEstimate {
  shopName: string;
  reference: string;
  version: number;
  jobTitle: string;
  vehicle: string;
  customerName: string | null;
  currency: string;
  note: string | null;
  lines: Array<Pick<EstimateLine, 'kind' | 'description' | 'quantity' | 'unitPriceMinor' | 'taxRatePercent' | 'netMinor' | 'taxMinor' | 'grossMinor'>>;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  taxByRate: { ratePercent: number; netMinor: number; taxMinor: number }[];
  expiresAt: string;
}

export interface PublicEstimateDecision {
  status: 'approved' | 'declined';
  reference: string;
  version: number;
  decidedAt: string;
  approvedAmountMinor: number | null;
}

/** Approved amount against what the job is now estimated at and what it has actually used. */
export interface JobApprovalState {
  jobId: string;
  currency: string;
  /** The latest approved estimate, if any. */
  approved: { estimateId: string; reference: string; version: number; amountMinor: number; at: string } | null;
  /** The newest estimate of the job (any status but superseded). */
  latest: { estimateId: string; reference: string; version: number; status: EstimateStatus; grossMinor: number } | null;
  /** Parts issued at sell prices and labour at its rate, tax included. */
  actualGrossMinor: number;
  /** True when the latest estimate or the actual value exceeds the approved amount. */
  overApproved: boolean;
}
