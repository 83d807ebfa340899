import { shopIdParamsSchema, shopSettingsSchema, updateShopSettingsRequestSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const ownerOnly = { 403: 'Owners only (never API keys)', 404: 'Not a member of that shop' };

/** OpenAPI entries of the settings routes. */
export const settingsRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/shops/{shopId}/settings', summary: "The shop's settings (defaults until changed)", tag: 'settings', auth: true, params: shopIdParamsSchema, response: shopSettingsSchema, errors: ownerOnly },
  {
    method: 'patch',
    path: '/api/shops/{shopId}/settings',
    summary: 'Change some settings; audited with before and after',
    tag: 'settings',
    auth: true,
    params: shopIdParamsSchema,
    body: updateShopSettingsRequestSchema,
    response: shopSettingsSchema,
    errors: ownerOnly,
  },
];
