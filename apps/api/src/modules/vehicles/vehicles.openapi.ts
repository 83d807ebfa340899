import { z } from 'zod';
import {
  fileUploadFieldsSchema,
  fileUploadResponseSchema,
  numbersCheckInputSchema,
  odometerInputSchema,
  odometerReadingSchema,
  shopIdParamsSchema,
  statusMoveInputSchema,
  timelineResponseSchema,
  vehicleDetailSchema,
  vehicleFileContentQuerySchema,
  vehicleFileParamsSchema,
  vehicleFitmentResponseSchema,
  vehicleIdParamsSchema,
  vehicleInputSchema,
  vehicleListQuerySchema,
  vehicleListResponseSchema,
  vehicleUpdateSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'vehicles';
const read = { 404: 'Not a member of that shop, or no such vehicle in it' };
const write = { 403: 'Not allowed for this role (owner and mechanic work on vehicles; only the owner sets money fields)', 404: 'Not a member of that shop, or an id (in the URL or body) not in it' };
const base = (path: string) => `/api/shops/{shopId}/vehicles${path}`;
const binary = z.string().meta({ format: 'binary' });

/** The vehicles routes for the OpenAPI document. */
export const vehicleRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'List vehicles (filter by kind, status, marque, customer or a word; up to 100 a page)', tag, auth: true, params: shopIdParamsSchema, query: vehicleListQuerySchema, response: vehicleListResponseSchema, errors: read },
  {
    method: 'post',
    path: base(''),
    summary: 'Record a vehicle arriving. A 17-character VIN with a wrong check digit is refused (400, details[0].warning = vin_check_digit) unless acknowledgeCheckDigit is true',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: vehicleInputSchema,
    response: vehicleDetailSchema,
    status: 201,
    errors: write,
  },
  { method: 'get', path: base('/{vehicleId}'), summary: 'A vehicle with its readings, files, status history and possible moves', tag, auth: true, params: vehicleIdParamsSchema, response: vehicleDetailSchema, errors: read },
  { method: 'patch', path: base('/{vehicleId}'), summary: 'Change a vehicle (the VIN is checked again when it changes)', tag, auth: true, params: vehicleIdParamsSchema, body: vehicleUpdateSchema, response: vehicleDetailSchema, errors: write },
  { method: 'post', path: base('/{vehicleId}/status'), summary: 'Move a vehicle to another status', tag, auth: true, params: vehicleIdParamsSchema, body: statusMoveInputSchema, response: vehicleDetailSchema, errors: { ...write, 409: 'That move is not possible from the current status' } },
  { method: 'post', path: base('/{vehicleId}/odometer-readings'), summary: 'Record an odometer reading (mi or km)', tag, auth: true, params: vehicleIdParamsSchema, body: odometerInputSchema, response: odometerReadingSchema, status: 201, errors: write },
  { method: 'post', path: base('/{vehicleId}/numbers-check'), summary: 'Record whether frame and engine numbers match the documents (who and when are recorded)', tag, auth: true, params: vehicleIdParamsSchema, body: numbersCheckInputSchema, response: vehicleDetailSchema, errors: write },
  { method: 'get', path: base('/{vehicleId}/timeline'), summary: 'What happened to a vehicle, newest first', tag, auth: true, params: vehicleIdParamsSchema, response: timelineResponseSchema, errors: read },
  { method: 'get', path: base('/{vehicleId}/fitment'), summary: 'Parts that fit the vehicle, from catalogue fitment, with free stock', tag, auth: true, params: vehicleIdParamsSchema, response: vehicleFitmentResponseSchema, errors: read },
  {
    method: 'post',
    path: base('/{vehicleId}/files'),
    summary: 'Upload photos (JPEG, PNG, WebP; re-encoded without location data) and PDF documents, in form field "files" (at most 10, 15 MB each)',
    tag,
    auth: true,
    params: vehicleIdParamsSchema,
    body: fileUploadFieldsSchema.extend({ files: z.array(binary) }),
    bodyType: 'multipart/form-data',
    response: fileUploadResponseSchema,
    status: 201,
    errors: { ...write, 413: 'A file is larger than the limit', 415: 'A file is neither a photo nor a PDF (by its content)' },
  },
  { method: 'get', path: base('/{vehicleId}/files/{fileId}/content'), summary: 'A stored photo (inline) or document (download)', tag, auth: true, params: vehicleFileParamsSchema, query: vehicleFileContentQuerySchema, response: binary, responseType: '*/*', errors: read },
  { method: 'get', path: base('/{vehicleId}/files/{fileId}/thumbnail'), summary: 'The thumbnail of a photo', tag, auth: true, params: vehicleFileParamsSchema, query: vehicleFileContentQuerySchema, response: binary, responseType: 'image/jpeg', errors: read },
  { method: 'delete', path: base('/{vehicleId}/files/{fileId}'), summary: 'Remove a photo or document', tag, auth: true, params: vehicleFileParamsSchema, response: z.null().meta({ description: 'No content' }), status: 204, errors: write },
];
