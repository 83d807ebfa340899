import { z } from 'zod';
import {
  catalogueProblemsResponseSchema,
  fitmentIdParamsSchema,
  fitmentInputSchema,
  fitmentSchema,
  fitmentUpdateSchema,
  importFieldsSchema,
  importResultSchema,
  lineageGraphResponseSchema,
  linkIdParamsSchema,
  linkInputSchema,
  linkSchema,
  linkUpdateSchema,
  partDetailResponseSchema,
  partIdParamsSchema,
  partInputSchema,
  partListQuerySchema,
  partListResponseSchema,
  partSchema,
  partUpdateSchema,
  resolveQuerySchema,
  resolveResponseSchema,
  shopIdParamsSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'catalogue';
const read = { 404: 'Not a member of that shop, or no such record in it' };
const write = { 403: 'Not allowed for this role (owner and buyer edit the catalogue)', 404: 'Not a member of that shop, or an id (in the URL or body) not in it' };
const noContent = z.null().meta({ description: 'No content' });
const base = (path: string) => `/api/shops/{shopId}${path}`;

/** The catalogue's routes for the OpenAPI document. */
export const catalogueRouteDocs: RouteDoc[] = [
  { method: 'get', path: base('/parts'), summary: 'List parts (filters, paging up to 100 a page)', tag, auth: true, params: shopIdParamsSchema, query: partListQuerySchema, response: partListResponseSchema, errors: read },
  { method: 'post', path: base('/parts'), summary: 'Add a part', tag, auth: true, params: shopIdParamsSchema, body: partInputSchema, response: partSchema, status: 201, errors: { ...write, 409: 'A part with that number exists' } },
  { method: 'get', path: base('/parts/{partId}'), summary: 'A part with links, fitments, current parts and problems', tag, auth: true, params: partIdParamsSchema, response: partDetailResponseSchema, errors: read },
  { method: 'patch', path: base('/parts/{partId}'), summary: 'Change a part', tag, auth: true, params: partIdParamsSchema, body: partUpdateSchema, response: partSchema, errors: { ...write, 409: 'A part with that number exists' } },
  { method: 'get', path: base('/parts/{partId}/lineage'), summary: 'The lineage around a part, bounded, for the lineage picture', tag, auth: true, params: partIdParamsSchema, response: lineageGraphResponseSchema, errors: read },
  { method: 'post', path: base('/part-links'), summary: 'Link two parts (replaced_by, kit_contains, equivalent)', tag, auth: true, params: shopIdParamsSchema, body: linkInputSchema, response: linkSchema, status: 201, errors: { ...write, 409: 'The link exists' } },
  { method: 'patch', path: base('/part-links/{linkId}'), summary: 'Change a link', tag, auth: true, params: linkIdParamsSchema, body: linkUpdateSchema, response: linkSchema, errors: write },
  { method: 'delete', path: base('/part-links/{linkId}'), summary: 'Remove a link', tag, auth: true, params: linkIdParamsSchema, response: noContent, status: 204, errors: write },
  { method: 'post', path: base('/fitments'), summary: 'Add a fitment to a part', tag, auth: true, params: shopIdParamsSchema, body: fitmentInputSchema, response: fitmentSchema, status: 201, errors: write },
  { method: 'patch', path: base('/fitments/{fitmentId}'), summary: 'Change a fitment', tag, auth: true, params: fitmentIdParamsSchema, body: fitmentUpdateSchema, response: fitmentSchema, errors: write },
  { method: 'delete', path: base('/fitments/{fitmentId}'), summary: 'Remove a fitment', tag, auth: true, params: fitmentIdParamsSchema, response: noContent, status: 204, errors: write },
  {
    method: 'get',
    path: base('/lineage/resolve'),
    summary: 'Resolve a number (or a supplier number) to its current parts and what can fill a demand for it',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    query: resolveQuerySchema,
    response: resolveResponseSchema,
    errors: { 404: 'No part with that number in the shop' },
  },
  { method: 'get', path: base('/catalogue/problems'), summary: 'Every lineage data problem of the catalogue', tag, auth: true, params: shopIdParamsSchema, response: catalogueProblemsResponseSchema, errors: read },
  {
    method: 'post',
    path: base('/imports'),
    summary: 'Preview or commit a CSV file of parts, links or fitments (all or nothing)',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    bodyType: 'multipart/form-data',
    body: importFieldsSchema.extend({ file: z.string().meta({ format: 'binary', description: 'The CSV file (UTF-8, comma or semicolon), at most 20 MB' }) }),
    response: importResultSchema,
    errors: { ...write, 400: 'Missing file, kind or mode, unknown or missing column', 409: 'The catalogue changed during the import', 413: 'File larger than 20 MB', 415: 'Not a UTF-8 text file' },
  },
  ...(['parts', 'links', 'fitments'] as const).map(
    (kind): RouteDoc => ({ method: 'get', path: base(`/exports/${kind}.csv`), summary: `Export the ${kind} as CSV, in the import format`, tag, auth: true, params: shopIdParamsSchema, responseType: 'text/csv', response: z.string(), errors: read }),
  ),
];
