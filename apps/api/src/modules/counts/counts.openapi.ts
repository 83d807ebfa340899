import { countDetailSchema, countEntrySchema, countIdParamsSchema, countLineSchema, countListQuerySchema, countListSchema, countStartSchema, shopIdParamsSchema, varianceReportSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'counts';
const base = (rest: string) => `/api/shops/{shopId}/counts${rest}`;
const one = { 403: 'The role may not do this', 404: 'Not a member of that shop, or no such count in it' };
const closed = { ...one, 409: 'The count was already posted or abandoned (details.reason count_closed)' };

/** The stock count routes for the OpenAPI document. */
export const countRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'Stock counts, newest first, with progress', tag, auth: true, params: shopIdParamsSchema, query: countListQuerySchema, response: countListSchema, errors: { 404: 'Not a member of that shop' } },
  {
    method: 'post',
    path: base(''),
    summary: 'Start a count of chosen bins or categories: freezes the expected quantity of every line in scope',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: countStartSchema,
    response: countDetailSchema,
    status: 201,
    errors: { 403: 'The role may not start counts', 404: 'A chosen bin is not in the shop', 409: 'Some of the stock is in another open count (count_overlap), or nothing of the categories is in stock (count_empty)' },
  },
  { method: 'get', path: base('/{countId}'), summary: 'A count with every line: frozen, counted, expected and variance, who counted and when', tag, auth: true, params: countIdParamsSchema, response: countDetailSchema, errors: one },
  {
    method: 'post',
    path: base('/{countId}/entries'),
    summary: 'Enter a counted quantity for a line (mode set replaces, add adds), or for stock found in a bin of the count that was not on the list',
    tag,
    auth: true,
    params: countIdParamsSchema,
    body: countEntrySchema,
    response: countLineSchema,
    status: 201,
    errors: { ...closed, 409: 'Count closed (count_closed), the bin or part is outside the count (count_out_of_scope), or the stock is in another open count (count_overlap)' },
  },
  { method: 'get', path: base('/{countId}/variances'), summary: 'Variance report: quantity and value differences of every counted line (moving-average cost; once posted, the ledger’s figures)', tag, auth: true, params: countIdParamsSchema, response: varianceReportSchema, errors: one },
  {
    method: 'post',
    path: base('/{countId}/post'),
    summary: 'Post the count: a `counted` movement per counted line, referenced "Stock count N", all in one transaction',
    tag,
    auth: true,
    params: countIdParamsSchema,
    response: countDetailSchema,
    errors: { ...closed, 409: 'Closed already, or refused whole: a serialised line with a variance (serialised), a line that would go below zero or below what is held, found stock with no cost (no_cost_basis)' },
  },
  { method: 'post', path: base('/{countId}/abandon'), summary: 'Abandon an open count; stock is not touched', tag, auth: true, params: countIdParamsSchema, response: countDetailSchema, errors: closed },
];
