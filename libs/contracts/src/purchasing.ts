import { z } from 'zod';
import { idSchema, emailSchema } from './common';
import { importResultSchema } from './import-result';
import { printedNumberSchema } from './part-fields';
import { stockConditionSchema } from './stock';

// Purchasing (issue 8): suppliers, listings, the reorder list, purchase orders, receipts, returns.
// Money is in integer minor units; an order's amounts are in its own currency and carry the
// exchange rate (shop currency per unit of the order's currency) entered on the order.

const minor = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(1_000_000_000, 'That amount is too large.');
const currencySchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z]{3}$/, 'Use a three-letter ISO 4217 currency code such as GBP.')
  .transform((s) => s.toUpperCase())
  .refine((code) => Intl.supportedValuesOf('currency').includes(code), 'This is not a currency code we know.');
const days = z.number().int('Use whole days.').min(0, 'Use zero or more days.').max(365, 'Use at most 365 days.');
const reasonSchema = z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(500, 'Use at most 500 characters.');

/** Decimal exchange rate as text, so it is stored exactly: "1", "0.8571", "1.17345". */
export const exchangeRateSchema = z
  .string()
  .trim()
  .regex(/^\d{1,6}(\.\d{1,8})?$/, 'Write the rate as a decimal such as 1.1734 (up to 8 decimals).')
  .refine((s) => Number(s) > 0, 'The rate must be more than 0.');

const supplierBase = {
  name: z.string().trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
  email: emailSchema.nullable(),
  currency: currencySchema,
  leadTimeDays: days,
  /** Standard deviation of the lead time in days, when known. */
  leadTimeSdDays: z.number().min(0, 'Use zero or more days.').max(365, 'Use at most 365 days.').nullable(),
  minOrderValueMinor: minor,
  notes: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable(),
};
export const supplierInputSchema = z
  .object({
    ...supplierBase,
    email: supplierBase.email.default(null),
    leadTimeSdDays: supplierBase.leadTimeSdDays.default(null),
    minOrderValueMinor: supplierBase.minOrderValueMinor.default(0),
    notes: supplierBase.notes.default(null),
  })
  .strict();
// No defaults here: a field left out of a change stays as it is.
export const supplierUpdateSchema = z
  .object({ ...supplierBase, active: z.boolean() })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');

export const supplierSchema = z.object({
  id: idSchema,
  name: z.string(),
  email: z.string().nullable(),
  currency: z.string(),
  leadTimeDays: z.number().int(),
  leadTimeSdDays: z.number().nullable(),
  minOrderValueMinor: z.number().int(),
  notes: z.string().nullable(),
  active: z.boolean(),
  listingCount: z.number().int(),
  openOrderCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Supplier = z.infer<typeof supplierSchema>;
export const supplierListResponseSchema = z.object({ suppliers: z.array(supplierSchema) });

const listingBase = {
  supplierNumber: printedNumberSchema.nullable(),
  priceMinor: minor,
  packSize: z.number().int('Use a whole number.').min(1, 'A pack holds at least 1.').max(100_000, 'That pack is too large.'),
  minOrderQty: z.number().int('Use a whole number.').min(0, 'Use zero or more.').max(1_000_000, 'That minimum is too large.'),
  leadTimeDays: days.nullable(),
};
export const listingInputSchema = z
  .object({
    partId: idSchema,
    ...listingBase,
    supplierNumber: listingBase.supplierNumber.default(null),
    packSize: listingBase.packSize.default(1),
    minOrderQty: listingBase.minOrderQty.default(0),
    leadTimeDays: listingBase.leadTimeDays.default(null),
  })
  .strict();
// No defaults here: a field left out of a change stays as it is.
export const listingUpdateSchema = z
  .object(listingBase)
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');

export const listingSchema = z.object({
  id: idSchema,
  supplierId: idSchema,
  supplierName: z.string(),
  currency: z.string(),
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  supplierNumber: z.string().nullable(),
  priceMinor: z.number().int(),
  packSize: z.number().int(),
  minOrderQty: z.number().int(),
  leadTimeDays: z.number().int().nullable(),
  /** Last unit price paid, in the shop's currency (`shopCurrency`), and when. */
  lastPaidUnitMinor: z.number().int().nullable(),
  lastPaidAt: z.string().nullable(),
  shopCurrency: z.string(),
  preferred: z.boolean(),
});
export type Listing = z.infer<typeof listingSchema>;
export const listingListResponseSchema = z.object({ listings: z.array(listingSchema) });

/** Per-part purchasing: the preferred supplier and a minimum/maximum set by hand (all nullable). */
export const partPurchasingSchema = z
  .object({
    preferredSupplierId: idSchema.nullable(),
    minQty: z.number().int().min(0).max(1_000_000).nullable(),
    maxQty: z.number().int().min(0).max(1_000_000).nullable(),
  })
  .strict()
  .refine((v) => v.minQty === null || v.maxQty === null || v.minQty <= v.maxQty, { message: 'The minimum cannot be above the maximum.', path: ['maxQty'] });
export type PartPurchasing = z.infer<typeof partPurchasingSchema>;
export const partPurchasingResponseSchema = z.object({
  partId: idSchema,
  preferredSupplierId: idSchema.nullable(),
  minQty: z.number().int().nullable(),
  maxQty: z.number().int().nullable(),
  listings: z.array(listingSchema),
});
export type PartPurchasingResponse = z.infer<typeof partPurchasingResponseSchema>;

export const purchasingSettingsSchema = z.object({
  demandWindowDays: z.number().int().min(7, 'Use 7 to 1095 days.').max(1095, 'Use 7 to 1095 days.'),
  deadStockDays: z.number().int().min(30, 'Use 30 to 3650 days.').max(3650, 'Use 30 to 3650 days.'),
});
export type PurchasingSettings = z.infer<typeof purchasingSettingsSchema>;
export const defaultPurchasingSettings: PurchasingSettings = { demandWindowDays: 180, deadStockDays: 365 };
export const purchasingSettingsUpdateSchema = purchasingSettingsSchema
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one setting.');

export const listingImportColumns = ['supplier', 'part_number', 'supplier_number', 'price', 'pack_size', 'min_order_qty', 'lead_time_days'] as const;
/** Result of a listings import: as the catalogue import's, without the kind. */
export const listingImportResultSchema = importResultSchema.omit({ kind: true });
export type ListingImportResult = z.infer<typeof listingImportResultSchema>;
export const listingImportFieldsSchema = z.object({ mode: z.enum(['preview', 'commit']) }).strict();

export const supplierIdParamsSchema = z.object({ shopId: idSchema, supplierId: idSchema }).strict();
export const listingIdParamsSchema = z.object({ shopId: idSchema, listingId: idSchema }).strict();
export const orderIdParamsSchema = z.object({ shopId: idSchema, orderId: idSchema }).strict();
export const returnIdParamsSchema = z.object({ shopId: idSchema, returnId: idSchema }).strict();
export const purchasingPartParamsSchema = z.object({ shopId: idSchema, partId: idSchema }).strict();

export const purchaseOrderStatuses = ['draft', 'awaiting_approval', 'approved', 'sent', 'partly_received', 'received', 'cancelled', 'closed'] as const;
export type PurchaseOrderStatus = (typeof purchaseOrderStatuses)[number];

export const orderLineInputSchema = z
  .object({
    partId: idSchema,
    quantity: z.number().int('Use a whole number.').min(1, 'Order at least 1.').max(1_000_000, 'That quantity is too large.'),
    /** Unit price in the order's currency; the supplier's listed price when left out. */
    unitPriceMinor: minor.optional(),
    /** Refundable core deposit per unit, in the order's currency. */
    coreDepositMinor: minor.default(0),
    /** What the part is needed for (a special order), if anything. */
    purpose: z.string().trim().min(1).max(200).nullable().default(null),
    /** The job's special order this line buys for: what arrives is held for that job. */
    specialOrderId: idSchema.nullable().default(null),
  })
  .strict();

export const orderInputSchema = z
  .object({
    supplierId: idSchema,
    exchangeRate: exchangeRateSchema.optional(),
    note: z.string().trim().max(1000, 'Use at most 1000 characters.').nullable().default(null),
    lines: z.array(orderLineInputSchema).min(1, 'Add at least one line.').max(500, 'At most 500 lines.'),
  })
  .strict();
export const orderUpdateSchema = z
  .object({
    exchangeRate: exchangeRateSchema,
    note: z.string().trim().max(1000).nullable(),
    lines: z.array(orderLineInputSchema).min(1, 'Add at least one line.').max(500, 'At most 500 lines.'),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');

export const orderFromReorderSchema = z
  .object({ partIds: z.array(idSchema).max(500).default([]), specialOrderIds: z.array(idSchema).max(500).default([]) })
  .strict()
  .refine((v) => v.partIds.length + v.specialOrderIds.length > 0, { message: 'Choose at least one suggestion.', path: ['partIds'] });
export const reasonBodySchema = z.object({ reason: reasonSchema }).strict();

export const receiptInputSchema = z
  .object({
    lines: z
      .array(
        z
          .object({
            lineId: idSchema,
            quantity: z.number().int('Use a whole number.').min(1, 'Receive at least 1.').max(1_000_000),
            binId: idSchema,
            condition: stockConditionSchema.default('new'),
            /** Price paid per unit in the order's currency; the order line's price when left out. */
            unitPriceMinor: minor.optional(),
          })
          .strict(),
      )
      .min(1, 'Receive at least one line.')
      .max(500),
  })
  .strict();

export const orderLineSchema = z.object({
  id: idSchema,
  position: z.number().int(),
  partId: idSchema,
  partNumber: z.string(),
  supplierNumber: z.string().nullable(),
  description: z.string(),
  quantity: z.number().int(),
  receivedQuantity: z.number().int(),
  cancelledQuantity: z.number().int(),
  outstandingQuantity: z.number().int(),
  unitPriceMinor: z.number().int(),
  coreDepositMinor: z.number().int(),
  lineTotalMinor: z.number().int(),
  purpose: z.string().nullable(),
  specialOrderId: idSchema.nullable(),
});

export const receiptSchema = z.object({
  id: idSchema,
  lineId: idSchema,
  binId: idSchema,
  binCode: z.string(),
  condition: z.string(),
  quantity: z.number().int(),
  unitPriceMinor: z.number().int(),
  unitCostShopMinor: z.number().int(),
  receivedAt: z.string(),
});

export const purchaseOrderSchema = z.object({
  id: idSchema,
  number: z.number().int(),
  reference: z.string(),
  supplierId: idSchema,
  supplierName: z.string(),
  supplierEmail: z.string().nullable(),
  status: z.enum(purchaseOrderStatuses),
  currency: z.string(),
  shopCurrency: z.string(),
  exchangeRate: z.string(),
  totalMinor: z.number().int(),
  totalShopMinor: z.number().int(),
  note: z.string().nullable(),
  approvalRequestedAt: z.string().nullable(),
  approvedAt: z.string().nullable(),
  rejectionReason: z.string().nullable(),
  sentAt: z.string().nullable(),
  closedReason: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  lines: z.array(orderLineSchema),
  receipts: z.array(receiptSchema),
});
export type PurchaseOrder = z.infer<typeof purchaseOrderSchema>;
export const purchaseOrderSummarySchema = purchaseOrderSchema.omit({ lines: true, receipts: true }).extend({ lineCount: z.number().int() });
export const purchaseOrderListQuerySchema = z
  .object({ status: z.enum(purchaseOrderStatuses).optional(), supplierId: idSchema.optional() })
  .strict();
/** The most orders one list answer holds: the newest, by number (narrow by state or supplier for older ones). */
export const purchaseOrderListLimit = 500;
export const purchaseOrderListResponseSchema = z.object({
  orders: z.array(purchaseOrderSummarySchema),
  /** True when more orders match than the answer holds (the newest `purchaseOrderListLimit`). */
  truncated: z.boolean().optional(),
});
export const sendOrderResponseSchema = z.object({ order: purchaseOrderSchema, emailed: z.boolean(), message: z.string() });
export const ordersFromReorderResponseSchema = z.object({ orders: z.array(purchaseOrderSchema), skipped: z.array(z.object({ partId: idSchema, reason: z.string() })) });

export const supplierReturnKinds = ['return', 'core'] as const;
export type SupplierReturnKind = (typeof supplierReturnKinds)[number];
export const supplierReturnInputSchema = z
  .object({
    kind: z.enum(supplierReturnKinds).default('return'),
    supplierId: idSchema,
    /** The order line it came on (needed for a core: its deposit is the credit expected). */
    lineId: idSchema.nullable().default(null),
    partId: idSchema,
    /** Where a returned part leaves from; cores do not come from stock. */
    binId: idSchema.nullable().default(null),
    condition: stockConditionSchema.default('new'),
    quantity: z.number().int().min(1, 'Return at least 1.').max(1_000_000),
    reason: reasonSchema,
    /** Credit expected, in the supplier's currency; from the order line when left out. */
    expectedCreditMinor: minor.optional(),
  })
  .strict();
export const creditInputSchema = z.object({ creditedMinor: minor, creditReference: z.string().trim().max(120).nullable().default(null) }).strict();
export const supplierReturnSchema = z.object({
  id: idSchema,
  kind: z.enum(supplierReturnKinds),
  supplierId: idSchema,
  supplierName: z.string(),
  orderId: idSchema.nullable(),
  lineId: idSchema.nullable(),
  partId: idSchema,
  partNumber: z.string(),
  quantity: z.number().int(),
  reason: z.string(),
  expectedCreditMinor: z.number().int(),
  currency: z.string(),
  status: z.enum(['open', 'credited']),
  creditedMinor: z.number().int().nullable(),
  creditReference: z.string().nullable(),
  creditedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type SupplierReturn = z.infer<typeof supplierReturnSchema>;
export const supplierReturnListResponseSchema = z.object({ returns: z.array(supplierReturnSchema) });

/** One day of demand for a current part, split by the number it was issued under. */
export const demandDaySchema = z.object({ date: z.string(), byNumber: z.record(z.string(), z.number()) });

export const reorderSuggestionSchema = z.object({
  partId: idSchema,
  partNumber: z.string(),
  description: z.string(),
  supplierId: idSchema.nullable(),
  supplierName: z.string().nullable(),
  listingId: idSchema.nullable(),
  method: z.enum(['statistical', 'min_max']),
  demand: z.object({ windowDays: z.number().int(), total: z.number(), meanPerDay: z.number(), sdPerDay: z.number().nullable(), fedBy: z.array(z.object({ partId: idSchema, number: z.string(), quantity: z.number(), ownDemandOnly: z.boolean() })) }),
  leadTime: z.object({ days: z.number(), sdDays: z.number().nullable() }),
  serviceLevel: z.number(),
  z: z.number(),
  model: z.enum(['variable_demand', 'variable_lead_time', 'both_variable', 'lead_time_demand', 'none']),
  safetyStock: z.number(),
  reorderPoint: z.number(),
  eoq: z.number().nullable(),
  supply: z.object({ free: z.number(), onOrder: z.number(), substitutes: z.number(), position: z.number() }),
  wanted: z.number(),
  quantity: z.number().int(),
  packSize: z.number().int(),
  minOrderQty: z.number().int(),
  unitPriceMinor: z.number().int().nullable(),
  valueMinor: z.number().int().nullable(),
  currency: z.string().nullable(),
  reasons: z.array(z.string()),
  history: z.array(demandDaySchema),
});
export type ReorderSuggestion = z.infer<typeof reorderSuggestionSchema>;

export const reorderGroupSchema = z.object({
  supplierId: idSchema.nullable(),
  supplierName: z.string().nullable(),
  currency: z.string().nullable(),
  totalMinor: z.number().int(),
  minOrderValueMinor: z.number().int(),
  shortfallMinor: z.number().int(),
  partIds: z.array(idSchema),
  specialOrderIds: z.array(idSchema),
});

/** A job's special order waiting to be bought: the quantity the job needs, rounded up to the supplier's pack. */
export const specialOrderSuggestionSchema = z.object({
  specialOrderId: idSchema,
  jobId: idSchema,
  jobNumber: z.number().int(),
  partId: idSchema,
  partNumber: z.string(),
  description: z.string(),
  needed: z.number().int(),
  quantity: z.number().int(),
  free: z.number(),
  supplierId: idSchema.nullable(),
  supplierName: z.string().nullable(),
  unitPriceMinor: z.number().int().nullable(),
  valueMinor: z.number().int().nullable(),
  currency: z.string().nullable(),
  requestedAt: z.string(),
});
export type SpecialOrderSuggestion = z.infer<typeof specialOrderSuggestionSchema>;

export const stockHealthRowSchema = z.object({ partId: idSchema, partNumber: z.string(), description: z.string(), onHand: z.number().int(), valueMinor: z.number().int(), lastIssuedAt: z.string().nullable(), issuedInWindow: z.number() });

export const reorderListResponseSchema = z.object({
  generatedAt: z.string(),
  settings: z.object({ demandWindowDays: z.number().int(), deadStockDays: z.number().int(), serviceLevel: z.number(), orderingCostMinor: z.number().int(), holdingCostRatePercent: z.number(), currency: z.string() }),
  suggestions: z.array(reorderSuggestionSchema),
  specialOrders: z.array(specialOrderSuggestionSchema),
  groups: z.array(reorderGroupSchema),
  slowMovers: z.array(stockHealthRowSchema),
  deadStock: z.array(stockHealthRowSchema),
});
export type ReorderListResponse = z.infer<typeof reorderListResponseSchema>;
