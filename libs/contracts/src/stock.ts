import { z } from 'zod';
import { idSchema } from './common';
import { partOriginSchema } from './part-fields';
import { holdStatuses, stockConditions, valuationMethods } from './constants/stock';

export * from './constants/stock';

// Stock (issue 6): bins, the append-only movement ledger, holds, serialised items and valuation.

export const stockConditionSchema = z.enum(stockConditions, { error: 'Use new, nos, used_good, used_fair, reconditioned or core.' });

export const movementKinds = ['received', 'issued', 'returned', 'adjusted', 'moved', 'counted'] as const;
export const movementKindSchema = z.enum(movementKinds);
export type MovementKind = z.infer<typeof movementKindSchema>;

/** Whole units; the largest quantity one movement may carry. */
export const maxMovementQuantity = 100_000;
/** Largest unit cost in minor units (a million in major units). */
export const maxUnitCostMinor = 100_000_000;

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const optionalText = (max: number, label: string) =>
  text(max, label)
    .nullish()
    .transform((v) => (v ? v : null));

const quantitySchema = z
  .number({ error: 'Enter the quantity as a whole number.' })
  .int('Enter the quantity as a whole number.')
  .min(1, 'The quantity must be at least 1.')
  .max(maxMovementQuantity, `At most ${maxMovementQuantity} in one movement.`);
const unitCostSchema = z
  .number({ error: 'Enter the unit cost in minor units (pence, cents).' })
  .int('The unit cost is a whole number of minor units (pence, cents).')
  .min(0, 'The unit cost cannot be negative.')
  .max(maxUnitCostMinor, 'That unit cost is too large.');

/** An engine, gearbox or frame number as stamped: letters, digits and the usual separators. */
export const serialSchema = z
  .string()
  .trim()
  .min(1, 'Enter the number stamped on the item.')
  .max(40, 'A serial number has at most 40 characters.')
  .regex(/^[A-Za-z0-9 .\-/_]+$/, 'Use letters, digits, spaces, dots, dashes, slashes or underscores only.');

export const binCodeSchema = z
  .string()
  .trim()
  .min(1, 'Enter the bin code, e.g. B-04.')
  .max(20, 'A bin code has at most 20 characters.')
  .regex(/^[A-Za-z0-9][A-Za-z0-9 .\-/]*$/, 'Start with a letter or digit; use letters, digits, spaces, dots, dashes or slashes.');

export const binInputSchema = z.object({ code: binCodeSchema, description: optionalText(200, 'The description') }).strict();
export type BinInput = z.input<typeof binInputSchema>;
export const binUpdateSchema = z.object({ code: binCodeSchema, description: optionalText(200, 'The description'), active: z.boolean() }).partial().strict();
export type BinUpdate = z.input<typeof binUpdateSchema>;

export const binSchema = z.object({
  id: idSchema,
  code: z.string(),
  description: z.string().nullable(),
  active: z.boolean(),
  /** Units on hand in the bin, all parts and conditions. */
  onHand: z.number().int(),
  /** Stock lines with something on hand. */
  lineCount: z.number().int(),
});
export type Bin = z.infer<typeof binSchema>;
export const binListResponseSchema = z.object({ bins: z.array(binSchema) });
export type BinListResponse = z.infer<typeof binListResponseSchema>;

const lineFields = { partId: idSchema, binId: idSchema, condition: stockConditionSchema };
const reference = optionalText(120, 'The reference');
const note = optionalText(500, 'The note');

export const stockReceiptInputSchema = z
  .object({
    ...lineFields,
    quantity: quantitySchema,
    unitCostMinor: unitCostSchema,
    /** Serialised items: one number per unit; each is then tracked and costed on its own. */
    serials: z.array(serialSchema).max(50, 'At most 50 serialised items in one receipt.').optional(),
    reference,
    note,
  })
  .strict()
  .refine((r) => !r.serials || r.serials.length === r.quantity, { message: 'Give one serial number for each unit received.', path: ['serials'] })
  .refine((r) => !r.serials || new Set(r.serials.map((s) => s.toUpperCase())).size === r.serials.length, { message: 'A serial number appears twice.', path: ['serials'] });
export type StockReceiptInput = z.input<typeof stockReceiptInputSchema>;

export const stockIssueInputSchema = z
  .object({
    ...lineFields,
    quantity: quantitySchema,
    /** Required for a serialised item: which one leaves. */
    serial: serialSchema.optional(),
    /** Issue stock set aside by this hold (its quantity is used up first). */
    holdId: idSchema.optional(),
    reference,
    note,
  })
  .strict();
export type StockIssueInput = z.input<typeof stockIssueInputSchema>;

export const stockReturnInputSchema = z
  .object({
    ...lineFields,
    quantity: quantitySchema,
    /** The cost it was issued at; the current average when left out. */
    unitCostMinor: unitCostSchema.optional(),
    serial: serialSchema.optional(),
    reference,
    note,
  })
  .strict();
export type StockReturnInput = z.input<typeof stockReturnInputSchema>;

export const stockAdjustmentInputSchema = z
  .object({
    ...lineFields,
    quantityDelta: z
      .number({ error: 'Enter the change as a whole number, e.g. -2.' })
      .int('Enter the change as a whole number, e.g. -2.')
      .min(-maxMovementQuantity)
      .max(maxMovementQuantity)
      .refine((d) => d !== 0, 'The change cannot be zero.'),
    /** Cost of stock found; stock written off leaves at the average. */
    unitCostMinor: unitCostSchema.optional(),
    reason: text(200, 'The reason').min(3, 'Say why the stock is adjusted (at least 3 characters).'),
    reference,
  })
  .strict();
export type StockAdjustmentInput = z.input<typeof stockAdjustmentInputSchema>;

export const stockMoveInputSchema = z
  .object({
    partId: idSchema,
    condition: stockConditionSchema,
    fromBinId: idSchema,
    toBinId: idSchema,
    quantity: quantitySchema,
    serial: serialSchema.optional(),
    reference,
    note,
  })
  .strict()
  .refine((m) => m.fromBinId !== m.toBinId, { message: 'Choose a different bin to move to.', path: ['toBinId'] });
export type StockMoveInput = z.input<typeof stockMoveInputSchema>;

export const stockCountInputSchema = z
  .object({
    ...lineFields,
    countedQuantity: z.number({ error: 'Enter the counted quantity.' }).int('Enter a whole number.').min(0, 'A count cannot be negative.').max(maxMovementQuantity),
    /** Cost of units found when nothing was on hand to take an average from. */
    unitCostMinor: unitCostSchema.optional(),
    note,
  })
  .strict();
export type StockCountInput = z.input<typeof stockCountInputSchema>;

export const holdInputSchema = z
  .object({
    ...lineFields,
    quantity: quantitySchema,
    purpose: text(200, 'The purpose').min(3, 'Say what the stock is held for (at least 3 characters).'),
  })
  .strict();
export type HoldInput = z.input<typeof holdInputSchema>;

export const holdSchema = z.object({
  id: idSchema,
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  binId: idSchema,
  binCode: z.string(),
  condition: stockConditionSchema,
  /** Units still held. */
  quantity: z.number().int(),
  purpose: z.string(),
  jobId: idSchema.nullable(),
  status: z.enum(holdStatuses),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  closedAt: z.string().nullable(),
});
export type Hold = z.infer<typeof holdSchema>;
/** Active holds oldest first (the longest waiting on top); released and issued ones newest first. */
export const holdListQuerySchema = z
  .object({
    partId: idSchema.optional(),
    status: z.enum(holdStatuses).default('active'),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 rows a page.').default(50),
  })
  .strict();
export const holdListResponseSchema = z.object({ holds: z.array(holdSchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
export type HoldListResponse = z.infer<typeof holdListResponseSchema>;

export const movementSchema = z.object({
  id: idSchema,
  seq: z.number().int(),
  kind: movementKindSchema,
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  binId: idSchema,
  binCode: z.string(),
  /** Moves only: where the stock went. */
  toBinId: idSchema.nullable(),
  toBinCode: z.string().nullable(),
  condition: stockConditionSchema,
  /** Change of the quantity on hand in `binId` (a move takes it out of `binId` and into `toBinId`). */
  quantityDelta: z.number().int(),
  /** Counts only: the quantity counted. */
  countedQuantity: z.number().int().nullable(),
  /** Unit cost given with the movement (receipts, returns, found stock), minor units. */
  unitCostMinor: z.number().int().nullable(),
  /** Value the movement added to (positive) or took from (negative) stock, minor units. */
  valueChangeMinor: z.number().int(),
  serial: z.string().nullable(),
  reason: z.string().nullable(),
  reference: z.string().nullable(),
  note: z.string().nullable(),
  holdId: idSchema.nullable(),
  jobId: idSchema.nullable(),
  occurredAt: z.string(),
  userName: z.string().nullable(),
});
export type Movement = z.infer<typeof movementSchema>;

const isoDate = z.iso.date('Use a date like 2026-03-01.');
export const movementListQuerySchema = z
  .object({
    partId: idSchema.optional(),
    binId: idSchema.optional(),
    kind: movementKindSchema.optional(),
    condition: stockConditionSchema.optional(),
    from: isoDate.optional(),
    to: isoDate.optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 rows a page.').default(50),
  })
  .strict();
export type MovementListQuery = z.input<typeof movementListQuerySchema>;
export const movementListResponseSchema = z.object({ movements: z.array(movementSchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
export type MovementListResponse = z.infer<typeof movementListResponseSchema>;

/** What a write answers: the movements it appended. */
export const movementWriteResponseSchema = z.object({ movements: z.array(movementSchema) });
export type MovementWriteResponse = z.infer<typeof movementWriteResponseSchema>;

export const stockLineSchema = z.object({
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  category: z.string().nullable(),
  origin: partOriginSchema,
  binId: idSchema,
  binCode: z.string(),
  condition: stockConditionSchema,
  onHand: z.number().int(),
  held: z.number().int(),
  /** On hand − held, never below zero. */
  free: z.number().int(),
});
export type StockLine = z.infer<typeof stockLineSchema>;

export const stockListQuerySchema = z
  .object({
    q: z.string().trim().max(100).optional(),
    partId: idSchema.optional(),
    binId: idSchema.optional(),
    condition: stockConditionSchema.optional(),
    /** Include lines at zero (they keep their history). */
    includeEmpty: z
      .enum(['true', 'false'])
      .optional()
      .transform((v) => v === 'true'),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 rows a page.').default(50),
  })
  .strict();
export type StockListQuery = z.input<typeof stockListQuerySchema>;
export const stockListResponseSchema = z.object({ lines: z.array(stockLineSchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
export type StockListResponse = z.infer<typeof stockListResponseSchema>;

/** A part's stock in a few numbers and per bin and condition (lookup results, the part page). */
export const stockSummarySchema = z.object({
  onHand: z.number().int(),
  held: z.number().int(),
  free: z.number().int(),
  lines: z.array(z.object({ binId: idSchema, binCode: z.string(), condition: stockConditionSchema, onHand: z.number().int(), held: z.number().int(), free: z.number().int() })),
});
export type StockSummary = z.infer<typeof stockSummarySchema>;

export const serialItemSchema = z.object({
  id: idSchema,
  serial: z.string(),
  binId: idSchema.nullable(),
  binCode: z.string().nullable(),
  condition: stockConditionSchema,
  costMinor: z.number().int(),
  inStock: z.boolean(),
  receivedAt: z.string(),
});
export type SerialItem = z.infer<typeof serialItemSchema>;

export const partValuationSchema = z.object({
  condition: stockConditionSchema,
  method: z.enum(valuationMethods),
  quantity: z.number().int(),
  valueMinor: z.number().int(),
  /** Moving-average unit cost (4 decimals of a minor unit), null when nothing is on hand or for serialised items. */
  unitCostMinor: z.number().nullable(),
});

export const fillOptionStockSchema = z.object({
  /** Numbers the option goes through from the part asked about, e.g. ["71-3465", "71-3465A"]. */
  via: z.array(z.string()),
  needsChanges: z.boolean(),
  parts: z.array(z.object({ partId: idSchema, number: z.string(), description: z.string(), quantity: z.number(), stock: stockSummarySchema })),
});
export type FillOptionStock = z.infer<typeof fillOptionStockSchema>;

export const partStockResponseSchema = z.object({
  partId: idSchema,
  number: z.string(),
  stock: stockSummarySchema,
  holds: z.array(holdSchema),
  serials: z.array(serialItemSchema),
  valuation: z.array(partValuationSchema),
  /** Every other way to fill a demand for this number (lineage engine), with its free stock. */
  fillOptions: z.array(fillOptionStockSchema),
  currency: z.string(),
});
export type PartStockResponse = z.infer<typeof partStockResponseSchema>;

const valueGroup = z.object({ key: z.string(), quantity: z.number().int(), valueMinor: z.number().int() });
export const valuationReportSchema = z.object({
  currency: z.string(),
  totalMinor: z.number().int(),
  totalQuantity: z.number().int(),
  byCategory: z.array(valueGroup),
  byOrigin: z.array(valueGroup),
  byCondition: z.array(valueGroup),
  byBin: z.array(valueGroup),
});
export type ValuationReport = z.infer<typeof valuationReportSchema>;

export const valueHistoryQuerySchema = z.object({ months: z.coerce.number().int().min(1).max(60).default(24) }).strict();
export const valueHistorySchema = z.object({ currency: z.string(), points: z.array(z.object({ date: z.string(), valueMinor: z.number().int() })) });
export type ValueHistory = z.infer<typeof valueHistorySchema>;

export const binIdParamsSchema = z.object({ shopId: idSchema, binId: idSchema }).strict();
export const holdIdParamsSchema = z.object({ shopId: idSchema, holdId: idSchema }).strict();
export const stockPartParamsSchema = z.object({ shopId: idSchema, partId: idSchema }).strict();
