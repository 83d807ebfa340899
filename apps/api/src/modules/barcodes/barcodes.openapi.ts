import { z } from 'zod';
import { barcodeCodeParamsSchema, barcodeInputSchema, barcodeLookupSchema, partBarcodeIdParamsSchema, partBarcodeListSchema, partBarcodeParamsSchema, partBarcodeSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'barcodes';

/** The supplier barcode routes for the OpenAPI document. */
export const barcodeRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/shops/{shopId}/parts/{partId}/barcodes', summary: 'Supplier barcodes (EAN/UPC/GTIN) attached to a part', tag, auth: true, params: partBarcodeParamsSchema, response: partBarcodeListSchema, errors: { 404: 'Not a member of that shop, or no such part in it' } },
  {
    method: 'post',
    path: '/api/shops/{shopId}/parts/{partId}/barcodes',
    summary: 'Attach a supplier barcode to a part; its GS1 check digit must be right',
    tag,
    auth: true,
    params: partBarcodeParamsSchema,
    body: barcodeInputSchema,
    response: partBarcodeSchema,
    status: 201,
    errors: { 400: 'Wrong check digit (details.reason check_digit, details.expected) or not a GTIN', 403: 'The role may not edit parts', 404: 'No such part in the shop', 409: 'The code is already on a part (barcode_taken)' },
  },
  { method: 'delete', path: '/api/shops/{shopId}/parts/{partId}/barcodes/{barcodeId}', summary: 'Take a barcode off a part', tag, auth: true, params: partBarcodeIdParamsSchema, response: z.null().meta({ description: 'No content' }), status: 204, errors: { 403: 'The role may not edit parts', 404: 'No such barcode on the part' } },
  {
    method: 'get',
    path: '/api/shops/{shopId}/barcodes/{code}',
    summary: 'The part a scanned barcode names (EAN/UPC matched as GTIN-14)',
    tag,
    auth: true,
    params: barcodeCodeParamsSchema,
    response: barcodeLookupSchema,
    errors: { 400: 'Not a valid GTIN (wrong check digit or length)', 404: 'A valid code on no part yet (details.reason barcode_unknown): offer to attach it' },
  },
];
