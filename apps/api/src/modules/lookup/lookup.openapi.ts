import { partSearchQuerySchema, partSearchResponseSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

/** The lookup's routes for the OpenAPI document. */
export const lookupRouteDocs: RouteDoc[] = [
  {
    method: 'get',
    path: '/api/shops/{shopId}/parts/search',
    summary: 'Look up parts by number (typos, missing prefix, supplier and equivalent numbers) or description words; each result says why it matched',
    tag: 'catalogue',
    auth: true,
    params: shopIdParamsSchema,
    query: partSearchQuerySchema,
    response: partSearchResponseSchema,
    errors: { 404: 'Not a member of that shop' },
  },
];
