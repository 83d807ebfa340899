import { z } from 'zod';
import { emailSchema, idSchema } from './common';
import { partOrigins } from './constants/catalogue';
import { sellPriceBases } from './constants/sales';

export * from './constants/sales';

// Sales (issue 12): pricing rules, list prices, tax rates, invoices and credit notes, payments.
// Money in integer minor units; quantities are decimal text (up to 4 places) so hours and parts
// are stored exactly. Tax rounding policy: docs/decisions/015-sales-prices-and-tax-rounding.md.

const minor = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(1_000_000_000, 'That amount is too large.');
const percent = z
  .number()
  .min(0, 'Use 0 to 1000.')
  .max(1000, 'Use 0 to 1000.')
  .refine((n) => !String(n).includes('e') && (String(n).split('.')[1] ?? '').length <= 3, 'Use at most 3 decimal places.');
const taxPercent = z
  .number()
  .min(0, 'Use 0 to 100.')
  .max(100, 'Use 0 to 100.')
  .refine((n) => !String(n).includes('e') && (String(n).split('.')[1] ?? '').length <= 3, 'Use at most 3 decimal places.');

export const priceRoundingValues = ['none', 'up-to-5', 'up-to-10', 'up-to-50', 'up-to-100', 'whole-minus-1'] as const;
export const taxRoundingValues = ['per-line', 'per-document'] as const;

// ── Pricing rules and tax ─────────────────────────────────────────────────────────────────────

export const pricingRulesSchema = z
  .object({
    useListPrice: z.boolean(),
    defaultMarkupPercent: percent,
    categoryMarkups: z
      .record(z.string().trim().min(1, 'Name the category.').max(60, 'Use at most 60 characters.'), percent)
      .refine((r) => Object.keys(r).length <= 100, 'Use at most 100 category rules.'),
    originMarkups: z.partialRecord(z.enum(partOrigins), percent),
    rounding: z.enum(priceRoundingValues),
  })
  .strict();
export type PricingRulesInput = z.infer<typeof pricingRulesSchema>;

export const taxRateInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the rate.').max(40, 'Use at most 40 characters.'),
    ratePercent: taxPercent,
  })
  .strict();
export const taxRateSchema = z.object({ id: z.string(), name: z.string(), ratePercent: z.number(), isDefault: z.boolean() });
export type TaxRate = z.infer<typeof taxRateSchema>;

/** The sales settings an owner edits: rules, tax rounding, extra tax rates (the default rate is the shop's taxRatePercent). */
export const salesSettingsSchema = z.object({
  pricingRules: pricingRulesSchema,
  taxRounding: z.enum(taxRoundingValues),
  /** Every rate: the shop's standard rate (settings) first, then the named extra rates. */
  taxRates: z.array(taxRateSchema),
  currency: z.string(),
  labourRateMinorPerHour: z.number().int(),
  updatedAt: z.string().nullable(),
});
export type SalesSettings = z.infer<typeof salesSettingsSchema>;
export const updateSalesSettingsSchema = z
  .object({
    pricingRules: pricingRulesSchema,
    taxRounding: z.enum(taxRoundingValues),
    /** Extra named rates (replace the list). */
    extraTaxRates: z.array(taxRateInputSchema).max(10, 'Use at most 10 extra rates.'),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one setting.');
export type UpdateSalesSettings = z.infer<typeof updateSalesSettingsSchema>;

/** A part's sell price as the pricing rules make it; cost and margin only for those allowed to see them. */
export const partSellPriceSchema = z.object({
  partId: z.string(),
  unitMinor: z.number().int().nullable(),
  basis: z.enum(sellPriceBases),
  markupPercent: z.number().nullable(),
  listPriceMinor: z.number().int().nullable(),
  /** Only for those who may read margins. */
  unitCostMinor: z.number().int().nullable().optional(),
  marginMinor: z.number().int().nullable().optional(),
});
export type PartSellPrice = z.infer<typeof partSellPriceSchema>;
export const sellPricesQuerySchema = z
  .object({ partIds: z.union([idSchema, z.array(idSchema).max(200)]).transform((v) => (Array.isArray(v) ? v : [v])) })
  .strict();
export const sellPricesResponseSchema = z.object({ currency: z.string(), prices: z.array(partSellPriceSchema) });
export type SellPricesResponse = z.infer<typeof sellPricesResponseSchema>;
export const partPriceParamsSchema = z.object({ shopId: idSchema, partId: idSchema }).strict();
export const setListPriceSchema = z.object({ listPriceMinor: minor.nullable() }).strict();
export type SetListPrice = z.infer<typeof setListPriceSchema>;

// ── Invoices ──────────────────────────────────────────────────────────────────────────────────

export const invoiceKinds = ['invoice', 'credit_note'] as const;
export const invoiceStatuses = ['draft', 'issued'] as const;
export const paymentStatuses = ['unpaid', 'part_paid', 'paid'] as const;
export const invoiceSources = ['job', 'counter', 'vehicle', 'manual', 'credit'] as const;
export const lineKinds = ['part', 'labour', 'vehicle', 'other'] as const;
export const paymentMethods = ['cash', 'bank_transfer', 'card'] as const;

/** Decimal quantity as text or number, up to 4 places. */
export const quantitySchema = z
  .union([z.string().trim(), z.number()])
  .transform((v) => String(v))
  .refine((s) => /^\d{1,6}(\.\d{1,4})?$/.test(s), 'Write the quantity as a number with up to 4 decimals.')
  .refine((s) => Number(s) > 0, 'The quantity must be more than 0.');

const customerFields = {
  customerId: idSchema.nullable(),
  customerName: z.string().trim().min(1, 'Give the customer’s name.').max(120, 'Use at most 120 characters.'),
  customerEmail: emailSchema.nullable(),
  customerAddress: z.string().trim().max(500, 'Use at most 500 characters.').nullable(),
};

export const invoiceLineInputSchema = z
  .object({
    kind: z.enum(lineKinds),
    partId: idSchema.nullable().default(null),
    description: z.string().trim().min(1, 'Describe the line.').max(200, 'Use at most 200 characters.'),
    quantity: quantitySchema,
    /** Leave out for a part line to take its sell price. */
    unitPriceMinor: minor.optional(),
    discountPercent: z.number().min(0, 'Use 0 to 100.').max(100, 'Use 0 to 100.').default(0),
    /** Leave out for the shop's standard rate. */
    taxRatePercent: taxPercent.optional(),
  })
  .strict();
export type InvoiceLineInput = z.input<typeof invoiceLineInputSchema>;

/** A manual draft: lines typed in. */
export const createInvoiceSchema = z
  .object({
    customerId: customerFields.customerId.default(null),
    customerName: customerFields.customerName.optional(),
    customerEmail: customerFields.customerEmail.optional(),
    customerAddress: customerFields.customerAddress.optional(),
    notes: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable().default(null),
    lines: z.array(invoiceLineInputSchema).max(200, 'Use at most 200 lines.').default([]),
  })
  .strict();
export type CreateInvoice = z.input<typeof createInvoiceSchema>;

export const invoiceFromJobSchema = z.object({ jobId: idSchema }).strict();
export const invoiceFromVehicleSchema = z
  .object({
    vehicleId: idSchema,
    customerId: idSchema.nullable().default(null),
    customerName: customerFields.customerName.optional(),
    customerEmail: customerFields.customerEmail.optional(),
    customerAddress: customerFields.customerAddress.optional(),
    priceMinor: minor,
    taxRatePercent: taxPercent.optional(),
  })
  .strict();

export const counterSaleLineSchema = z
  .object({
    partId: idSchema,
    binId: idSchema,
    condition: z.string().trim().min(1).max(20),
    quantity: z.number().int('Whole units only.').min(1, 'At least 1.').max(100_000, 'That is too many.'),
    unitPriceMinor: minor.optional(),
    discountPercent: z.number().min(0, 'Use 0 to 100.').max(100, 'Use 0 to 100.').default(0),
  })
  .strict();
export const counterSaleSchema = z
  .object({
    customerId: idSchema.nullable().default(null),
    customerName: customerFields.customerName.default('Counter sale'),
    customerEmail: customerFields.customerEmail.default(null),
    lines: z.array(counterSaleLineSchema).min(1, 'Add at least one part.').max(100, 'Use at most 100 lines.'),
    /** Issue (number) the invoice at once. */
    issue: z.boolean().default(true),
  })
  .strict();
export type CounterSale = z.input<typeof counterSaleSchema>;

export const updateInvoiceSchema = z
  .object({
    customerId: customerFields.customerId,
    customerName: customerFields.customerName,
    customerEmail: customerFields.customerEmail,
    customerAddress: customerFields.customerAddress,
    notes: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable(),
    lines: z.array(invoiceLineInputSchema).max(200, 'Use at most 200 lines.'),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');
export type UpdateInvoice = z.input<typeof updateInvoiceSchema>;

export const creditNoteSchema = z
  .object({
    /** Lines of the invoice to credit with quantities; leave out to credit the whole invoice. */
    lines: z.array(z.object({ lineId: idSchema, quantity: quantitySchema }).strict()).min(1).max(200).optional(),
    reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(500, 'Use at most 500 characters.'),
  })
  .strict();
export type CreditNoteInput = z.input<typeof creditNoteSchema>;

export const invoiceParamsSchema = z.object({ shopId: idSchema, invoiceId: idSchema }).strict();
export const invoiceListQuerySchema = z
  .object({
    status: z.enum(['draft', 'issued', 'unpaid', 'part_paid', 'paid']).optional(),
    kind: z.enum(invoiceKinds).optional(),
    customerId: idSchema.optional(),
    q: z.string().trim().max(120).optional(),
    from: z.iso.date().optional(),
    to: z.iso.date().optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(25),
  })
  .strict();
export type InvoiceListQuery = z.input<typeof invoiceListQuerySchema>;

export const invoiceLineSchema = z.object({
  id: z.string(),
  position: z.number().int(),
  kind: z.enum(lineKinds),
  partId: z.string().nullable(),
  partNumber: z.string().nullable(),
  description: z.string(),
  quantity: z.string(),
  unitPriceMinor: z.number().int(),
  /** The sell price the rules gave when the line was made; differs from unitPriceMinor when overridden. */
  listedUnitPriceMinor: z.number().int().nullable(),
  priceOverridden: z.boolean(),
  discountPercent: z.number(),
  taxRatePercent: z.number(),
  netMinor: z.number().int(),
  taxMinor: z.number().int(),
  grossMinor: z.number().int(),
  /** Only for those who may read margins. */
  unitCostMinor: z.number().int().nullable().optional(),
  creditedLineId: z.string().nullable(),
});
export type InvoiceLine = z.infer<typeof invoiceLineSchema>;

export const paymentSchema = z.object({
  id: z.string(),
  method: z.enum(paymentMethods),
  amountMinor: z.number().int(),
  receivedOn: z.string(),
  reference: z.string().nullable(),
  recordedBy: z.string().nullable(),
  createdAt: z.string(),
});
export type Payment = z.infer<typeof paymentSchema>;

export const invoiceSummarySchema = z.object({
  id: z.string(),
  kind: z.enum(invoiceKinds),
  status: z.enum(invoiceStatuses),
  paymentStatus: z.enum(paymentStatuses),
  number: z.string().nullable(),
  source: z.enum(invoiceSources),
  customerId: z.string().nullable(),
  customerName: z.string(),
  currency: z.string(),
  netMinor: z.number().int(),
  taxMinor: z.number().int(),
  grossMinor: z.number().int(),
  paidMinor: z.number().int(),
  dueMinor: z.number().int(),
  /**
   * Paid and credited beyond the total (two card checkouts of the same amount both completed,
   * say). The shop refunds it or keeps it as the customer's credit; Tappet refunds nothing itself.
   */
  overpaidMinor: z.number().int(),
  issuedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type InvoiceSummary = z.infer<typeof invoiceSummarySchema>;

export const invoiceSchema = invoiceSummarySchema.extend({
  customerEmail: z.string().nullable(),
  customerAddress: z.string().nullable(),
  notes: z.string().nullable(),
  jobId: z.string().nullable(),
  jobNumber: z.number().int().nullable(),
  vehicleId: z.string().nullable(),
  creditedInvoiceId: z.string().nullable(),
  creditedInvoiceNumber: z.string().nullable(),
  creditReason: z.string().nullable(),
  creditNotes: z.array(z.object({ id: z.string(), number: z.string().nullable(), grossMinor: z.number().int() })),
  taxRounding: z.enum(taxRoundingValues),
  lines: z.array(invoiceLineSchema),
  taxByRate: z.array(z.object({ ratePercent: z.number(), netMinor: z.number().int(), taxMinor: z.number().int() })),
  payments: z.array(paymentSchema),
  /** Credited by credit notes (reduces what is due). */
  creditedMinor: z.number().int(),
  /** Only for those who may read margins. */
  marginMinor: z.number().int().nullable().optional(),
  emailedAt: z.string().nullable(),
});
export type Invoice = z.infer<typeof invoiceSchema>;
export const invoiceListResponseSchema = z.object({ invoices: z.array(invoiceSummarySchema), total: z.number().int() });
export type InvoiceListResponse = z.infer<typeof invoiceListResponseSchema>;

export const recordPaymentSchema = z
  .object({
    method: z.enum(['cash', 'bank_transfer']),
    amountMinor: minor.refine((n) => n > 0, 'The amount must be more than 0.'),
    receivedOn: z.iso.date('Use a date such as 2026-03-01.'),
    reference: z.string().trim().max(120, 'Use at most 120 characters.').nullable().default(null),
  })
  .strict();
export type RecordPayment = z.input<typeof recordPaymentSchema>;

export const cardCheckoutSchema = z.object({ amountMinor: minor.refine((n) => n > 0, 'The amount must be more than 0.').optional() }).strict();
export const cardCheckoutResponseSchema = z.object({ url: z.string(), sessionId: z.string(), amountMinor: z.number().int() });
export type CardCheckoutResponse = z.infer<typeof cardCheckoutResponseSchema>;

/** The customer-facing pay link (no account): /api/pay/:token. */
export const payTokenParamsSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,200}$/) }).strict();
