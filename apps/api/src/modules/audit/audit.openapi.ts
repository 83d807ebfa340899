import { z } from 'zod';
import { auditEventCsvQuerySchema, auditEventListResponseSchema, auditEventQuerySchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'audit';
const ownerOnly = { 403: 'Owners only (never API keys)', 404: 'Not a member of that shop' };

/** OpenAPI entries of the audit log routes. */
export const auditRouteDocs: RouteDoc[] = [
  {
    method: 'get',
    path: '/api/shops/{shopId}/audit-events',
    summary: 'The audit log, newest first, filtered by actor (person or key), entity and dates; at most 100 a page',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    query: auditEventQuerySchema,
    response: auditEventListResponseSchema,
    errors: ownerOnly,
  },
  {
    method: 'get',
    path: '/api/shops/{shopId}/audit-events.csv',
    summary: "The audit log as CSV (streamed, oldest first; formula-like cells prefixed with ')",
    tag,
    auth: true,
    params: shopIdParamsSchema,
    query: auditEventCsvQuerySchema,
    response: z.string(),
    responseType: 'text/csv',
    errors: ownerOnly,
  },
];
