import { apiKeyListResponseSchema, apiKeyParamsSchema, apiKeySummarySchema, createApiKeyRequestSchema, createApiKeyResponseSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'api-keys';
const ownerOnly = { 403: 'Owners only (never API keys)', 404: 'Not a member of that shop, or no such key in it' };

/** OpenAPI entries of the API key routes. */
export const apiKeyRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/shops/{shopId}/api-keys', summary: 'API keys of the shop (never their secrets)', tag, auth: true, params: shopIdParamsSchema, response: apiKeyListResponseSchema, errors: ownerOnly },
  {
    method: 'post',
    path: '/api/shops/{shopId}/api-keys',
    summary: 'Create a key (viewer or buyer); the secret is in this answer only. Send it as `Authorization: Bearer tpk_…`',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: createApiKeyRequestSchema,
    response: createApiKeyResponseSchema,
    status: 201,
    errors: ownerOnly,
  },
  { method: 'post', path: '/api/shops/{shopId}/api-keys/{apiKeyId}/revoke', summary: 'Revoke a key: it answers 401 from now on', tag, auth: true, params: apiKeyParamsSchema, response: apiKeySummarySchema, errors: ownerOnly },
];
