import { z } from 'zod';
import { idSchema } from './common';
import { partOriginSchema, partStatusSchema } from './catalogue';
import { stockSummarySchema } from './stock';

// Lookup that forgives (issue 5): one search box over numbers, supplier numbers and descriptions.

export const lookupMatchKinds = ['exact', 'lineage', 'partial', 'fuzzy'] as const;
export const lookupMatchSchema = z.enum(lookupMatchKinds);
export type LookupMatch = z.infer<typeof lookupMatchSchema>;

/** Most results one search answers with. */
export const maxLookupResults = 50;

const filterText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .optional()
    .transform((v) => (v ? v : undefined));

export const partSearchQuerySchema = z
  .object({
    q: z.string().trim().min(1, 'Type something to look up.').max(100, 'A lookup has at most 100 characters.'),
    limit: z.coerce.number().int().min(1).max(maxLookupResults, `At most ${maxLookupResults} results.`).default(20),
    marque: filterText(60),
    model: filterText(80),
    year: z.coerce.number().int().min(1880).max(2100).optional(),
    category: filterText(60),
    origin: partOriginSchema.optional(),
  })
  .strict();
export type PartSearchQuery = z.input<typeof partSearchQuerySchema>;
export type PartSearchQueryParsed = z.output<typeof partSearchQuerySchema>;

export const partSearchResultSchema = z.object({
  id: idSchema,
  number: z.string(),
  description: z.string(),
  origin: partOriginSchema,
  category: z.string().nullable(),
  status: partStatusSchema,
  match: lookupMatchSchema,
  /** Why the part matched, in plain words ("supplier number 12-345", "close to 71-3465 (1 typo)"). */
  reason: z.string(),
  /** On hand, held and free in total and per bin and condition (issue 6). */
  stock: stockSummarySchema.optional(),
});
export type PartSearchResult = z.infer<typeof partSearchResultSchema>;

export const partSearchResponseSchema = z.object({ results: z.array(partSearchResultSchema) });
export type PartSearchResponse = z.infer<typeof partSearchResponseSchema>;
