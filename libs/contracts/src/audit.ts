import { z } from 'zod';
import { idSchema } from './common';

export * from './constants/audit';

/** A date (`2026-01-15`) or a full ISO date-time. */
const dateOrDateTime = z.union([z.iso.date(), z.iso.datetime({ offset: true })]);

/** Filters of the audit log (list and CSV). `to` given as a date includes that whole day. */
export const auditEventQuerySchema = z
  .object({
    /** A user id or an API key id. */
    actor: idSchema.optional(),
    entity: z.string().trim().min(1).max(100).optional(),
    from: dateOrDateTime.optional(),
    to: dateOrDateTime.optional(),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(100, 'At most 100 events a page.').default(50),
  })
  .strict();
export type AuditEventQuery = z.infer<typeof auditEventQuerySchema>;

/** The CSV export takes the same filters, without paging. */
export const auditEventCsvQuerySchema = auditEventQuerySchema.omit({ page: true, pageSize: true }).strict();

export const auditEventSchema = z.object({
  id: idSchema,
  action: z.string(),
  entity: z.string(),
  entityId: z.string().nullable(),
  actor: z.object({
    userId: idSchema.nullable(),
    userName: z.string().nullable(),
    apiKeyId: idSchema.nullable(),
    apiKeyLabel: z.string().nullable(),
  }),
  changes: z.record(z.string(), z.object({ before: z.unknown(), after: z.unknown() })),
  ip: z.string().nullable(),
  createdAt: z.string(),
});
export type AuditEventView = z.infer<typeof auditEventSchema>;

export const auditEventListResponseSchema = z.object({
  events: z.array(auditEventSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type AuditEventListResponse = z.infer<typeof auditEventListResponseSchema>;
