import { z } from 'zod';
import { shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

/** OpenAPI entry of the whole-shop export. */
export const shopExportRouteDocs: RouteDoc[] = [
  {
    method: 'get',
    path: '/api/shops/{shopId}/export.zip',
    summary: 'The whole shop as a streamed zip: a CSV per table plus the uploads, no secrets. Works while the shop is read-only',
    tag: 'export',
    auth: true,
    params: shopIdParamsSchema,
    response: z.string().meta({ format: 'binary' }),
    responseType: 'application/zip',
    errors: { 403: 'Owners only (never API keys)', 404: 'Not a member of that shop' },
  },
];
