import { z } from 'zod';
import { idSchema } from './common';
import { labelFormatSchema } from './labels';
import { maxMovementQuantity, stockConditionSchema } from './stock';

// Stock counts (issue 7): a count covers chosen bins or categories; starting it freezes the
// expected quantity of every line (part × bin × condition) in scope; people enter what they
// counted; posting turns each counted line's variance into a `counted` movement.

export const countStatuses = ['open', 'posted', 'abandoned'] as const;
export const countStatusSchema = z.enum(countStatuses);
export type CountStatus = z.infer<typeof countStatusSchema>;

/** At most this many bins or categories in one count's scope. */
export const maxCountScope = 200;
/** At most this many lines in one count (a larger stocktake is split into several counts). */
export const maxCountLines = 5000;

const distinct = <T>(items: T[]) => new Set(items).size === items.length;

/** Start a count: bins or categories (one of the two), and an optional note. */
export const countStartSchema = z
  .object({
    binIds: z.array(idSchema).max(maxCountScope, `Choose at most ${maxCountScope} bins.`).refine(distinct, 'Each bin at most once.').default([]),
    categories: z
      .array(z.string().trim().min(1, 'A category cannot be empty.').max(60))
      .max(maxCountScope, `Choose at most ${maxCountScope} categories.`)
      .refine(distinct, 'Each category at most once.')
      .default([]),
    note: z.string().trim().max(500, 'Keep the note under 500 characters.').optional(),
  })
  .strict()
  .refine((v) => (v.binIds.length > 0) !== (v.categories.length > 0), { message: 'Choose bins or categories to count (not both).', path: ['binIds'] });
export type CountStart = z.input<typeof countStartSchema>;
export type CountStartParsed = z.output<typeof countStartSchema>;

/**
 * One entry. `set` (the default) replaces what was counted on the line so far: the number is what
 * is on the shelf. `add` adds to it (a second box found, or one scan per item). Either a line of
 * the count (`lineId`) or a part found in a bin of the count that was not on the list.
 */
export const countEntrySchema = z
  .object({
    lineId: idSchema.optional(),
    partId: idSchema.optional(),
    binId: idSchema.optional(),
    condition: stockConditionSchema.optional(),
    quantity: z.number({ error: 'Enter the counted quantity.' }).int('Enter a whole number.').min(0, 'A count cannot be negative.').max(maxMovementQuantity),
    mode: z.enum(['set', 'add']).default('set'),
  })
  .strict()
  .refine((v) => (v.lineId !== undefined) !== (v.partId !== undefined && v.binId !== undefined && v.condition !== undefined), {
    message: 'Give the line, or the part, bin and condition of stock found (not both).',
    path: ['lineId'],
  });
export type CountEntry = z.input<typeof countEntrySchema>;
export type CountEntryParsed = z.output<typeof countEntrySchema>;

export const countIdParamsSchema = z.object({ shopId: idSchema, countId: idSchema }).strict();
export const countListQuerySchema = z.object({ status: countStatusSchema.optional() }).strict();

/** Who did something and when. */
const stamp = z.object({ at: z.string(), userId: z.string().nullable(), name: z.string().nullable() });

export const countSummarySchema = z.object({
  id: z.string(),
  number: z.number().int(),
  status: countStatusSchema,
  scope: z.object({ bins: z.array(z.object({ id: z.string(), code: z.string() })), categories: z.array(z.string()) }),
  note: z.string().nullable(),
  started: stamp,
  closed: stamp.nullable(),
  lineCount: z.number().int(),
  countedCount: z.number().int(),
  /** Lines counted with a difference (variance ≠ 0). */
  differenceCount: z.number().int(),
});
export type CountSummary = z.infer<typeof countSummarySchema>;

export const countLineSchema = z.object({
  id: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partDescription: z.string(),
  category: z.string().nullable(),
  binId: z.string(),
  binCode: z.string(),
  condition: stockConditionSchema,
  /** Tracked by serial number: a variance cannot be posted (find or issue the numbered items). */
  serialised: z.boolean(),
  /** On hand when the count started. */
  frozenQuantity: z.number().int(),
  /** Added during the count (stock found that was not on the list). */
  added: z.boolean(),
  countedQuantity: z.number().int().nullable(),
  /** Net movements on the line between the freeze and the moment it was counted. */
  movedSinceFreeze: z.number().int().nullable(),
  /** frozen + moved since the freeze: what should have been there when it was counted. */
  expectedQuantity: z.number().int().nullable(),
  /** counted − expected. */
  variance: z.number().int().nullable(),
  counted: stamp.nullable(),
});
export type CountLine = z.infer<typeof countLineSchema>;

export const countDetailSchema = countSummarySchema.extend({ lines: z.array(countLineSchema) });
export type CountDetail = z.infer<typeof countDetailSchema>;

export const countListSchema = z.object({ counts: z.array(countSummarySchema) });
export type CountList = z.infer<typeof countListSchema>;

/** A line of the variance report: quantity and value differences at the moving-average cost. */
export const varianceLineSchema = z.object({
  lineId: z.string(),
  partId: z.string(),
  partNumber: z.string(),
  partDescription: z.string(),
  binCode: z.string(),
  condition: stockConditionSchema,
  serialised: z.boolean(),
  expectedQuantity: z.number().int(),
  countedQuantity: z.number().int(),
  variance: z.number().int(),
  /** The part's moving-average unit cost (minor units) now; once posted, the ledger's own figure. */
  unitCostMinor: z.number().int().nullable(),
  valueDifferenceMinor: z.number().int().nullable(),
});
export type VarianceLine = z.infer<typeof varianceLineSchema>;

export const varianceReportSchema = z.object({
  countId: z.string(),
  status: countStatusSchema,
  currency: z.string(),
  /** Every counted line, differences first. */
  lines: z.array(varianceLineSchema),
  uncountedCount: z.number().int(),
  totals: z.object({ over: z.number().int(), short: z.number().int(), valueOverMinor: z.number().int(), valueShortMinor: z.number().int(), netValueMinor: z.number().int() }),
  /** After posting: the value the ledger actually moved. */
  postedValueMinor: z.number().int().nullable(),
});
export type VarianceReport = z.infer<typeof varianceReportSchema>;

/** Labels for a count's bins (and with `contents`, the parts in each). */
export const countLabelsRequestSchema = z
  .object({
    contents: z.boolean().default(false),
    format: labelFormatSchema.optional(),
    skip: z.number().int().min(0).max(29, 'A sheet has at most 30 labels.').default(0),
  })
  .strict();
export type CountLabelsRequest = z.input<typeof countLabelsRequestSchema>;
export type CountLabelsRequestParsed = z.output<typeof countLabelsRequestSchema>;

/**
 * Labels for what arrived: purchase receipts. `perUnit` (default) prints one label per unit
 * received, otherwise one per receipt.
 */
export const receiptLabelsRequestSchema = z
  .object({
    receiptIds: z.array(idSchema).min(1, 'Choose at least one receipt.').max(100, 'Print labels for at most 100 receipts at a time.').refine(distinct, 'Each receipt at most once.'),
    perUnit: z.boolean().default(true),
    format: labelFormatSchema.optional(),
    skip: z.number().int().min(0).max(29, 'A sheet has at most 30 labels.').default(0),
  })
  .strict();
export type ReceiptLabelsRequest = z.input<typeof receiptLabelsRequestSchema>;
export type ReceiptLabelsRequestParsed = z.output<typeof receiptLabelsRequestSchema>;
