import { z } from 'zod';
import { shopIdParamsSchema, unpaidAgeBuckets } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'sales-reports';
const base = (path: string) => `/api/shops/{shopId}/sales-reports${path}`;
const read = { 403: 'Mechanics see no sales reports', 404: 'Not a member of that shop' };
const owner = { 403: 'Only the owner sees gross margins', 404: 'Not a member of that shop' };
const money = z.number().int().meta({ description: 'Minor units (pence, cents)' });
// The query schema (salesReportQuerySchema) has refinements; the document lists its fields.
const query = z.object({ from: z.string().optional(), to: z.string().optional(), period: z.enum(['day', 'week', 'month']).optional() });

const salesSchema = z.looseObject({ currency: z.string(), period: z.string(), from: z.string(), to: z.string(), rows: z.array(z.looseObject({ start: z.string(), label: z.string(), netMinor: money, taxMinor: money, grossMinor: money })), totals: z.looseObject({ netMinor: money }) });
const marginsSchema = z.looseObject({ currency: z.string(), rows: z.array(z.looseObject({ start: z.string(), partsNetMinor: money, partsCostMinor: money, partsMarginMinor: money, labourNetMinor: money, labourMarginMinor: money })) });
const unpaidSchema = z.looseObject({ currency: z.string(), asOf: z.string(), buckets: z.array(z.object({ bucket: z.enum(unpaidAgeBuckets), count: z.number().int(), dueMinor: money })), totalDueMinor: money });

/** The sales reports routes for the OpenAPI document. */
export const salesReportRouteDocs: RouteDoc[] = [
  { method: 'get', path: base('/sales'), summary: 'Sales (invoices less credit notes) by day, week or month', tag, auth: true, params: shopIdParamsSchema, query, response: salesSchema, errors: read },
  { method: 'get', path: base('/sales.csv'), summary: 'Sales by period as CSV', tag, auth: true, params: shopIdParamsSchema, query, responseType: 'text/csv', response: z.string(), errors: read },
  { method: 'get', path: base('/margins'), summary: 'Gross margin on parts (sell − cost at issue) and labour by period', tag, auth: true, params: shopIdParamsSchema, query, response: marginsSchema, errors: owner },
  { method: 'get', path: base('/margins.csv'), summary: 'Gross margin by period as CSV', tag, auth: true, params: shopIdParamsSchema, query, responseType: 'text/csv', response: z.string(), errors: owner },
  { method: 'get', path: base('/unpaid'), summary: 'Unpaid invoices by age (0–30, 31–60, 61–90, over 90 days)', tag, auth: true, params: shopIdParamsSchema, response: unpaidSchema, errors: read },
  { method: 'get', path: base('/unpaid.csv'), summary: 'Unpaid invoices as CSV', tag, auth: true, params: shopIdParamsSchema, responseType: 'text/csv', response: z.string(), errors: read },
];
