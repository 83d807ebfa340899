import { z } from 'zod';
import { binLabelsRequestSchema, countIdParamsSchema, countLabelsRequestSchema, labelOptionsSchema, partLabelsRequestSchema, receiptLabelsRequestSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'labels';
const pdf = z.string().meta({ format: 'binary', description: 'A PDF of label sheets (or single roll labels); X-Label-Count and X-Page-Count headers give the counts.' });

/** The label routes for the OpenAPI document. */
export const labelRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/shops/{shopId}/labels/options', summary: "Label formats and the shop's default (for the print dialog)", tag, auth: true, params: shopIdParamsSchema, response: labelOptionsSchema, errors: { 404: 'Not a member of that shop' } },
  {
    method: 'post',
    path: '/api/shops/{shopId}/labels/parts',
    summary: 'Labels for chosen parts as a PDF (part number, description, bin, Code 128 and QR); changes nothing',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: partLabelsRequestSchema,
    response: pdf,
    responseType: 'application/pdf',
    errors: { 404: 'Not a member of that shop, or a chosen part not in it' },
  },
  {
    method: 'post',
    path: '/api/shops/{shopId}/labels/bins',
    summary: 'Labels for chosen bins as a PDF, optionally followed by labels for the parts stocked in each; changes nothing',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: binLabelsRequestSchema,
    response: pdf,
    responseType: 'application/pdf',
    errors: { 404: 'Not a member of that shop, or a chosen bin not in it' },
  },
  {
    method: 'post',
    path: '/api/shops/{shopId}/labels/counts/{countId}',
    summary: 'Labels for the bins of a stock count as a PDF, optionally followed by the parts stocked in each; changes nothing',
    tag,
    auth: true,
    params: countIdParamsSchema,
    body: countLabelsRequestSchema,
    response: pdf,
    responseType: 'application/pdf',
    errors: { 404: 'Not a member of that shop, or no such count in it' },
  },
  {
    method: 'post',
    path: '/api/shops/{shopId}/labels/receipts',
    summary: 'Labels for goods received on purchase receipts as a PDF: one per unit received (perUnit, the default) or one per receipt; changes nothing',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: receiptLabelsRequestSchema,
    response: pdf,
    responseType: 'application/pdf',
    errors: { 404: 'Not a member of that shop, or a chosen receipt not in it' },
  },
];
