import { z } from 'zod';
import {
  stockAdjustmentInputSchema,
  binIdParamsSchema,
  binInputSchema,
  binListResponseSchema,
  binSchema,
  binUpdateSchema,
  stockCountInputSchema,
  holdIdParamsSchema,
  holdInputSchema,
  holdListQuerySchema,
  holdListResponseSchema,
  holdSchema,
  stockIssueInputSchema,
  stockMoveInputSchema,
  movementListQuerySchema,
  movementListResponseSchema,
  movementWriteResponseSchema,
  partStockResponseSchema,
  stockReceiptInputSchema,
  stockReturnInputSchema,
  shopIdParamsSchema,
  stockListQuerySchema,
  stockListResponseSchema,
  stockPartParamsSchema,
  valuationReportSchema,
  valueHistoryQuerySchema,
  valueHistorySchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'stock';
const read = { 404: 'Not a member of that shop, or no such record in it' };
const write = (who: string, conflict: string) => ({
  403: `Not allowed for this role (${who})`,
  404: 'Not a member of that shop, or an id (in the URL or body) not in it; nothing changed',
  409: `${conflict}; details.reason says which`,
});
const base = (path: string) => `/api/shops/{shopId}/stock${path}`;

/** The stock module's routes for the OpenAPI document. */
export const stockRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'Stock lines (part × bin × condition) with on hand, held and free', tag, auth: true, params: shopIdParamsSchema, query: stockListQuerySchema, response: stockListResponseSchema, errors: read },
  { method: 'get', path: base('/bins'), summary: 'Bins with what they hold', tag, auth: true, params: shopIdParamsSchema, response: binListResponseSchema, errors: read },
  { method: 'post', path: base('/bins'), summary: 'Add a bin', tag, auth: true, params: shopIdParamsSchema, body: binInputSchema, response: binSchema, status: 201, errors: write('owner and buyer keep bins', 'A bin with that code exists') },
  { method: 'patch', path: base('/bins/{binId}'), summary: 'Change a bin (code, description, in use)', tag, auth: true, params: binIdParamsSchema, body: binUpdateSchema, response: binSchema, errors: write('owner and buyer keep bins', 'Code taken, or the bin still holds stock') },
  { method: 'get', path: base('/movements'), summary: 'The movement ledger, newest first, with filters', tag, auth: true, params: shopIdParamsSchema, query: movementListQuerySchema, response: movementListResponseSchema, errors: read },
  { method: 'post', path: base('/receipts'), summary: 'Receive stock into a bin at a unit cost (moving average), or numbered items each at its own cost', tag, auth: true, params: shopIdParamsSchema, body: stockReceiptInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner and buyer receive', 'Inactive bin, serial already on hand, or serialised and counted stock mixed') },
  { method: 'post', path: base('/issues'), summary: 'Issue free stock, or stock set aside by a hold', tag, auth: true, params: shopIdParamsSchema, body: stockIssueInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner and mechanic issue', 'Not enough free or held stock, hold closed, serial needed or not here') },
  { method: 'post', path: base('/returns'), summary: 'Return stock from a job to a bin', tag, auth: true, params: shopIdParamsSchema, body: stockReturnInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner and mechanic return', 'No cost to value it at, or the serialised item has not left stock') },
  { method: 'post', path: base('/adjustments'), summary: 'Adjust a line up or down, with the reason', tag, auth: true, params: shopIdParamsSchema, body: stockAdjustmentInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner adjusts', 'Not enough free stock, no cost basis, or a serialised line') },
  { method: 'post', path: base('/moves'), summary: 'Move free stock from one bin to another', tag, auth: true, params: shopIdParamsSchema, body: stockMoveInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner and buyer move', 'Not enough free stock, inactive bin, serial needed') },
  { method: 'post', path: base('/counts'), summary: 'Record a count of one line; the variance becomes the movement', tag, auth: true, params: shopIdParamsSchema, body: stockCountInputSchema, response: movementWriteResponseSchema, status: 201, errors: write('owner counts', 'Count below what is held, or a serialised line with a variance') },
  { method: 'get', path: base('/holds'), summary: 'Holds (active by default)', tag, auth: true, params: shopIdParamsSchema, query: holdListQuerySchema, response: holdListResponseSchema, errors: read },
  { method: 'post', path: base('/holds'), summary: 'Set free stock aside for a purpose', tag, auth: true, params: shopIdParamsSchema, body: holdInputSchema, response: holdSchema, status: 201, errors: write('owner and mechanic hold', 'Not enough free stock') },
  { method: 'post', path: base('/holds/{holdId}/release'), summary: 'Release a hold: its stock becomes free again', tag, auth: true, params: holdIdParamsSchema, response: holdSchema, errors: write('owner and mechanic hold', 'The hold is already released or issued') },
  { method: 'get', path: base('/parts/{partId}'), summary: "A part's stock per bin and condition, holds, serialised items, valuation, and every fill option's free stock", tag, auth: true, params: stockPartParamsSchema, response: partStockResponseSchema, errors: read },
  { method: 'get', path: base('/valuation'), summary: 'Stock value by category, origin, condition and bin', tag, auth: true, params: shopIdParamsSchema, response: valuationReportSchema, errors: read },
  { method: 'get', path: base('/valuation/history'), summary: 'Stock value at each month end and today, from the ledger', tag, auth: true, params: shopIdParamsSchema, query: valueHistoryQuerySchema, response: valueHistorySchema, errors: read },
  { method: 'get', path: base('/valuation.csv'), summary: 'Stock value per line as CSV', tag, auth: true, params: shopIdParamsSchema, responseType: 'text/csv', response: z.string(), errors: read },
];
