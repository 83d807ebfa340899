import { z } from 'zod';

// Sales reports (issue 12): sales by period, gross margin on parts and labour (owners only),
// unpaid invoices by age. Money in integer minor units; credit notes count against their period.

export const reportPeriods = ['day', 'week', 'month'] as const;
export type ReportPeriod = (typeof reportPeriods)[number];

const date = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2026-03-14.')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.');

export const salesReportQuerySchema = z
  .object({
    /** First day, inclusive; default: the start of the period eleven periods before today. */
    from: date.optional(),
    /** Last day, inclusive; default today. */
    to: date.optional(),
    period: z.enum(reportPeriods, { error: 'Use day, week or month.' }).default('month'),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The start must not be after the end.', path: ['from'] })
  .refine((q) => !q.from || !q.to || (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 <= 800, { message: 'Ask for at most about two years at a time.', path: ['from'] });
export type SalesReportQuery = z.input<typeof salesReportQuerySchema>;

export interface SalesPeriodRow {
  /** First day of the period (a Monday for weeks). */
  start: string;
  label: string;
  invoices: number;
  creditNotes: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
}

export interface SalesByPeriod {
  currency: string;
  period: ReportPeriod;
  from: string;
  to: string;
  rows: SalesPeriodRow[];
  totals: { netMinor: number; taxMinor: number; grossMinor: number };
}

export interface MarginPeriodRow {
  start: string;
  label: string;
  partsNetMinor: number;
  /** Cost at issue of the parts sold (the unit cost recorded on each line). */
  partsCostMinor: number;
  partsMarginMinor: number;
  /** Parts sold with no cost recorded (their margin counts as the whole net). */
  partsWithoutCost: number;
  labourNetMinor: number;
  /** Tappet records no wage cost, so labour's gross margin is its net sales. */
  labourMarginMinor: number;
}

export interface MarginsByPeriod {
  currency: string;
  period: ReportPeriod;
  from: string;
  to: string;
  rows: MarginPeriodRow[];
  totals: Omit<MarginPeriodRow, 'start' | 'label'>;
}

export const unpaidAgeBuckets = ['0-30', '31-60', '61-90', '90+'] as const;
export type UnpaidAgeBucket = (typeof unpaidAgeBuckets)[number];

export interface UnpaidInvoiceRow {
  invoiceId: string;
  number: string | null;
  customerName: string;
  issuedOn: string;
  ageDays: number;
  bucket: UnpaidAgeBucket;
  grossMinor: number;
  dueMinor: number;
}

export interface UnpaidByAge {
  currency: string;
  asOf: string;
  buckets: Array<{ bucket: UnpaidAgeBucket; count: number; dueMinor: number }>;
  invoices: UnpaidInvoiceRow[];
  totalDueMinor: number;
}
