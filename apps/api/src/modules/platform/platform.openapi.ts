import {
  createPlanRequestSchema,
  onboardShopRequestSchema,
  planListResponseSchema,
  planParamsSchema,
  planSchema,
  platformShopListQuerySchema,
  platformShopListResponseSchema,
  platformShopParamsSchema,
  platformShopSchema,
  shopStateChangeRequestSchema,
  shopStateChangeResponseSchema,
  updatePlanRequestSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'platform';
const adminsOnly = { 403: 'Platform admins only' };

/** OpenAPI entries of the platform console. */
export const platformRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/platform/shops', summary: 'Every shop with plan, billing state, usage and last activity; search and filter', tag, auth: true, query: platformShopListQuerySchema, response: platformShopListResponseSchema, errors: adminsOnly },
  {
    method: 'post',
    path: '/api/platform/shops',
    summary: "Onboard a shop: create it on a plan (14-day trial) and e-mail its owner's invitation",
    tag,
    auth: true,
    body: onboardShopRequestSchema,
    response: platformShopSchema,
    status: 201,
    errors: { ...adminsOnly, 404: 'No such plan' },
  },
  {
    method: 'post',
    path: '/api/platform/shops/{shopId}/suspend',
    summary: 'Suspend a shop by hand with a reason (read-only, nothing deleted)',
    tag,
    auth: true,
    params: platformShopParamsSchema,
    body: shopStateChangeRequestSchema,
    response: shopStateChangeResponseSchema,
    errors: { ...adminsOnly, 404: 'No such shop', 409: 'Already suspended by hand' },
  },
  {
    method: 'post',
    path: '/api/platform/shops/{shopId}/reactivate',
    summary: 'Lift a hand suspension with a reason; the state follows the subscription again',
    tag,
    auth: true,
    params: platformShopParamsSchema,
    body: shopStateChangeRequestSchema,
    response: shopStateChangeResponseSchema,
    errors: { ...adminsOnly, 404: 'No such shop', 409: 'Not suspended by hand' },
  },
  { method: 'get', path: '/api/platform/plans', summary: 'Every plan, active or not', tag, auth: true, response: planListResponseSchema, errors: adminsOnly },
  { method: 'post', path: '/api/platform/plans', summary: 'Create a plan (name, monthly price, limits, Stripe lookup key)', tag, auth: true, body: createPlanRequestSchema, response: planSchema, status: 201, errors: { ...adminsOnly, 409: 'Name or lookup key taken' } },
  {
    method: 'patch',
    path: '/api/platform/plans/{planId}',
    summary: 'Change a plan (or retire it with isActive: false)',
    tag,
    auth: true,
    params: planParamsSchema,
    body: updatePlanRequestSchema,
    response: planSchema,
    errors: { ...adminsOnly, 404: 'No such plan', 409: 'Name or lookup key taken' },
  },
];
