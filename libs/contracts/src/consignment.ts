import { z } from 'zod';
import { idSchema } from './common';
import type { VehicleKind, VehicleStatus } from './vehicles';

// Consignment (issue 12): terms agreed when a consigned vehicle comes in, and the settlement with
// the consignor after its sale. Money in integer minor units.

export const consignmentCommissionKindValues = ['percent', 'fixed'] as const;
export const payoutMethods = ['bank_transfer', 'cheque', 'cash'] as const;
export type PayoutMethod = (typeof payoutMethods)[number];

const minor = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(10_000_000_000, 'That amount is too large.');
const date = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2026-03-14.')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.');

export const consignmentTermsInputSchema = z
  .object({
    commissionKind: z.enum(consignmentCommissionKindValues, { error: 'Use percent or fixed.' }),
    /** For a percentage: 0–100 with up to 3 decimals. */
    commissionPercent: z
      .number()
      .min(0, 'Use 0 to 100.')
      .max(100, 'Use 0 to 100.')
      .refine((n) => !String(n).includes('e') && (String(n).split('.')[1] ?? '').length <= 3, 'Use at most 3 decimal places.')
      .nullable()
      .default(null),
    /** For a fixed commission. */
    commissionFixedMinor: minor.nullable().default(null),
    agreedOn: date,
    note: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable().default(null),
  })
  .strict()
  .refine((t) => t.commissionKind !== 'percent' || t.commissionPercent !== null, { message: 'Give the commission percentage.', path: ['commissionPercent'] })
  .refine((t) => t.commissionKind !== 'fixed' || t.commissionFixedMinor !== null, { message: 'Give the fixed commission.', path: ['commissionFixedMinor'] });
export type ConsignmentTermsInput = z.input<typeof consignmentTermsInputSchema>;

export const settlementInputSchema = z
  .object({
    salePriceMinor: minor.refine((n) => n > 0, 'The sale price must be more than 0.'),
    soldOn: date,
    note: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable().default(null),
  })
  .strict();
export type SettlementInput = z.input<typeof settlementInputSchema>;

export const payoutInputSchema = z
  .object({
    paidOn: date,
    method: z.enum(payoutMethods, { error: 'Use bank_transfer, cheque or cash.' }),
    reference: z.string().trim().min(1, 'Give the payment reference.').max(120, 'Use at most 120 characters.'),
  })
  .strict();
export type PayoutInput = z.input<typeof payoutInputSchema>;

export const consignmentVehicleParamsSchema = z.object({ shopId: idSchema, vehicleId: idSchema }).strict();

export interface ConsignmentTerms {
  commissionKind: 'percent' | 'fixed';
  commissionPercent: number | null;
  commissionFixedMinor: number | null;
  agreedOn: string;
  note: string | null;
  updatedAt: string;
}

/** A job the consignor approved through an estimate, with what it costs them. */
export interface ConsignmentWorkLine {
  jobId: string;
  jobNumber: number;
  title: string;
  estimateReference: string;
  approvedMinor: number;
  actualGrossMinor: number;
  /** What the settlement charges: the actual sell value, never more than approved. */
  chargedMinor: number;
}

export interface ConsignmentSettlement {
  id: string;
  reference: string;
  soldOn: string;
  salePriceMinor: number;
  commissionKind: 'percent' | 'fixed';
  commissionPercent: number | null;
  commissionFixedMinor: number | null;
  commissionMinor: number;
  work: ConsignmentWorkLine[];
  workMinor: number;
  payoutMinor: number;
  consignorOwesMinor: number;
  note: string | null;
  createdAt: string;
  payout: { paidOn: string; method: PayoutMethod; reference: string; recordedAt: string } | null;
}

export interface ConsignmentVehicle {
  vehicleId: string;
  vehicle: string;
  kind: VehicleKind;
  status: VehicleStatus;
  /** When the vehicle entered its status (for a sold one: the sale recorded on its page). */
  statusSince: string;
  askingPriceMinor: number | null;
  currency: string;
  consignor: { id: string; name: string; email: string | null } | null;
  terms: ConsignmentTerms | null;
  /** Work the consignor has approved so far (what a settlement made now would charge). */
  work: ConsignmentWorkLine[];
  settlement: ConsignmentSettlement | null;
}

export interface ConsignmentListRow {
  vehicleId: string;
  vehicle: string;
  status: VehicleStatus;
  consignorName: string | null;
  hasTerms: boolean;
  settlementReference: string | null;
  payoutMinor: number | null;
  paid: boolean;
}
