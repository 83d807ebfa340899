import { z } from 'zod';
import { idSchema } from './common';
import { interchanges, linkKinds, partStatuses } from './constants/catalogue';
import { partOriginSchema, printedNumberSchema } from './part-fields';

export * from './constants/catalogue';
// Split out so that other contracts use them without evaluating this whole module in the browser.
export * from './part-fields';
export * from './import-result';

// The catalogue: parts, the links between their numbers, and what they fit (issue 4).

export const partStatusSchema = z.enum(partStatuses, { error: 'Use available, or nla for no longer available.' });

export const linkKindSchema = z.enum(linkKinds, { error: 'Use replaced_by, kit_contains or equivalent.' });

export const interchangeSchema = z.enum(interchanges, { error: 'Use both, one_way or with_changes.' });

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const optionalText = (max: number, label: string) =>
  text(max, label)
    .nullish()
    .transform((v) => (v ? v : null));

const partFields = {
  number: printedNumberSchema,
  description: text(200, 'The description').min(1, 'Describe the part.'),
  origin: partOriginSchema,
  maker: optionalText(80, 'The maker'),
  category: optionalText(60, 'The category'),
  unit: text(20, 'The unit').min(1, 'Enter the unit.'),
  status: partStatusSchema,
  notes: optionalText(2000, 'The notes'),
  supplierNumbers: z.array(printedNumberSchema).max(20, 'At most 20 supplier numbers.'),
};

export const partInputSchema = z
  .object({
    ...partFields,
    origin: partFields.origin.default('genuine'),
    unit: partFields.unit.default('each'),
    status: partFields.status.default('available'),
    supplierNumbers: partFields.supplierNumbers.default([]),
  })
  .strict();
export type PartInput = z.input<typeof partInputSchema>;
export type PartInputParsed = z.output<typeof partInputSchema>;

/** Only the fields sent change: no defaults here (zod 4 would apply them inside `.partial()`). */
export const partUpdateSchema = z.object(partFields).partial().strict();

export const partSchema = z.object({
  id: idSchema,
  number: z.string(),
  /** Upper case, everything but letters and digits removed: what lookups compare. */
  key: z.string(),
  description: z.string(),
  origin: partOriginSchema,
  maker: z.string().nullable(),
  category: z.string().nullable(),
  unit: z.string(),
  status: partStatusSchema,
  notes: z.string().nullable(),
  supplierNumbers: z.array(z.string()),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Part = z.infer<typeof partSchema>;

export const partListQuerySchema = z
  .object({
    q: z.string().trim().max(100).optional(),
    category: z.string().trim().max(60).optional(),
    origin: partOriginSchema.optional(),
    status: partStatusSchema.optional(),
    problemsOnly: z
      .enum(['true', 'false'])
      .optional()
      .transform((v) => v === 'true'),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100, 'At most 100 rows a page.').default(50),
  })
  .strict();

export const partListResponseSchema = z.object({
  items: z.array(partSchema.extend({ problemCount: z.number().int() })),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  categories: z.array(z.string()),
});
export type PartListResponse = z.infer<typeof partListResponseSchema>;

const isoDate = z.iso.date('Use a date like 1974-03-01.');

export const linkInputSchema = z
  .object({
    fromPartId: idSchema,
    kind: linkKindSchema,
    /** The part the link points to; or `toNumber` for a number not (yet) in the catalogue. */
    toPartId: idSchema.optional(),
    toNumber: printedNumberSchema.optional(),
    quantity: z.number().positive('The quantity must be more than 0.').max(10_000).default(1),
    interchange: interchangeSchema.default('both'),
    effectiveDate: isoDate.nullish(),
    sourceReference: optionalText(120, 'The source reference'),
    note: optionalText(500, 'The note'),
  })
  .strict()
  .refine((l) => Boolean(l.toPartId) !== Boolean(l.toNumber), { message: 'Choose the part the link points to, or give its number.', path: ['toPartId'] })
  .refine((l) => l.kind !== 'equivalent' || l.interchange !== 'with_changes', { message: 'An equivalent is either both ways or one way.', path: ['interchange'] });

/** What can change on a link; its ends and kind cannot (delete it and link again). */
export const linkUpdateSchema = z
  .object({
    quantity: z.number().positive('The quantity must be more than 0.').max(10_000),
    interchange: interchangeSchema,
    effectiveDate: isoDate.nullable(),
    sourceReference: optionalText(120, 'The source reference'),
    note: optionalText(500, 'The note'),
  })
  .partial()
  .strict();

export const linkSchema = z.object({
  id: idSchema,
  fromPartId: idSchema,
  fromNumber: z.string(),
  kind: linkKindSchema,
  toPartId: idSchema.nullable(),
  toNumber: z.string(),
  quantity: z.number(),
  interchange: interchangeSchema,
  effectiveDate: z.string().nullable(),
  sourceReference: z.string().nullable(),
  note: z.string().nullable(),
});
export type PartLink = z.infer<typeof linkSchema>;

const year = z.number().int().min(1885, 'Use a year from 1885 on.').max(2100);

export const fitmentInputSchema = z
  .object({
    partId: idSchema,
    marque: text(60, 'The marque').min(1, 'Enter the marque.'),
    model: text(80, 'The model').min(1, 'Enter the model.'),
    yearFrom: year.nullish(),
    yearTo: year.nullish(),
    frameFrom: optionalText(40, 'The first frame number'),
    frameTo: optionalText(40, 'The last frame number'),
  })
  .strict()
  .refine((f) => f.yearFrom == null || f.yearTo == null || f.yearFrom <= f.yearTo, { message: 'The first year comes before the last.', path: ['yearTo'] });

/** What can change on a fitment (not the part it belongs to). */
export const fitmentUpdateSchema = z
  .object({
    marque: text(60, 'The marque').min(1, 'Enter the marque.'),
    model: text(80, 'The model').min(1, 'Enter the model.'),
    yearFrom: year.nullable(),
    yearTo: year.nullable(),
    frameFrom: optionalText(40, 'The first frame number'),
    frameTo: optionalText(40, 'The last frame number'),
  })
  .partial()
  .strict();

export const fitmentSchema = z.object({
  id: idSchema,
  partId: idSchema,
  marque: z.string(),
  model: z.string(),
  yearFrom: z.number().int().nullable(),
  yearTo: z.number().int().nullable(),
  frameFrom: z.string().nullable(),
  frameTo: z.string().nullable(),
});
export type Fitment = z.infer<typeof fitmentSchema>;

export const lineageProblemSchema = z.object({
  kind: z.enum(['cycle', 'dead_end', 'unknown_number', 'invalid_quantity']),
  numbers: z.array(z.string()),
});
export type LineageProblemView = z.infer<typeof lineageProblemSchema>;

const numberQuantity = z.object({ partId: idSchema.optional(), number: z.string(), quantity: z.number() });

export const resolveQuerySchema = z.object({ number: z.string().trim().min(1, 'Enter a number.').max(60) }).strict();

export const resolveResponseSchema = z.object({
  query: z.string(),
  part: partSchema.nullable(),
  current: z.array(numberQuantity),
  canFill: z.array(z.object({ parts: z.array(numberQuantity), via: z.array(z.string()), needsChanges: z.boolean() })),
  problems: z.array(lineageProblemSchema),
});
export type ResolveResponse = z.infer<typeof resolveResponseSchema>;

export const partDetailResponseSchema = z.object({
  part: partSchema,
  linksFrom: z.array(linkSchema),
  linksTo: z.array(linkSchema),
  fitments: z.array(fitmentSchema),
  current: z.array(numberQuantity),
  problems: z.array(lineageProblemSchema),
});
export type PartDetailResponse = z.infer<typeof partDetailResponseSchema>;

export const lineageGraphResponseSchema = z.object({
  /** `isCurrent`: one of the parts the focus part resolves to (its current parts). Numbers not in the catalogue are left out (see the part's problems). */
  nodes: z.array(z.object({ partId: idSchema, number: z.string(), description: z.string(), status: partStatusSchema, isCurrent: z.boolean(), isFocus: z.boolean(), inProblem: z.boolean() })),
  edges: z.array(z.object({ from: idSchema, to: idSchema, kind: linkKindSchema, interchange: interchangeSchema, quantity: z.number() })),
  truncated: z.boolean(),
});
export type LineageGraphResponse = z.infer<typeof lineageGraphResponseSchema>;

export const partIdParamsSchema = z.object({ shopId: idSchema, partId: idSchema }).strict();
export const linkIdParamsSchema = z.object({ shopId: idSchema, linkId: idSchema }).strict();
export const fitmentIdParamsSchema = z.object({ shopId: idSchema, fitmentId: idSchema }).strict();

/** The problems of the whole catalogue. */
export const catalogueProblemsResponseSchema = z.object({ problems: z.array(lineageProblemSchema) });
