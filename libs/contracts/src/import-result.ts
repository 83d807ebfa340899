import { z } from 'zod';

// What a CSV import answers (the catalogue's, and the purchasing listings' without its kind).

export const importKinds = ['parts', 'links', 'fitments'] as const;
export const importFieldsSchema = z.object({ kind: z.enum(importKinds), mode: z.enum(['preview', 'commit']) }).strict();

export const importRowErrorSchema = z.object({ row: z.number().int(), column: z.string().nullable(), message: z.string() });
export const importResultSchema = z.object({
  kind: z.enum(importKinds),
  mode: z.enum(['preview', 'commit']),
  rows: z.number().int(),
  added: z.number().int(),
  changed: z.number().int(),
  unchanged: z.number().int(),
  /** A sample of what would be added or changed (the first rows), for the preview screen. */
  sample: z.array(z.object({ row: z.number().int(), action: z.enum(['add', 'change', 'same']), summary: z.string() })),
  errors: z.array(importRowErrorSchema),
  committed: z.boolean(),
});
export type ImportResult = z.infer<typeof importResultSchema>;
