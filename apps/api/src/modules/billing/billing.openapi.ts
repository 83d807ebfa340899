import { z } from 'zod';
import {
  billingOverviewSchema,
  billingStatusSchema,
  checkoutRequestSchema,
  grantSupportAccessRequestSchema,
  okResponseSchema,
  redirectResponseSchema,
  shopIdParamsSchema,
  supportAccessResponseSchema,
  supportGrantSchema,
  webhookResponseSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const ownerOnly = { 403: 'Owners only (never API keys or support access)', 404: 'Not a member of that shop' };

/** OpenAPI entries of the billing, webhook and support-access routes. */
export const billingRouteDocs: RouteDoc[] = [
  {
    method: 'post',
    path: '/api/billing/webhook',
    summary: "Stripe's events, verified against the raw body with the Stripe-Signature header; each event id is processed once",
    tag: 'billing',
    auth: false,
    csrf: false,
    body: z.looseObject({ id: z.string(), type: z.string() }),
    response: webhookResponseSchema,
    errors: { 400: 'Missing or bad signature (nothing changed)' },
  },
  { method: 'get', path: '/api/shops/{shopId}/billing/status', summary: 'Billing state and read-only reason (every member)', tag: 'billing', auth: true, params: shopIdParamsSchema, response: billingStatusSchema, errors: { 404: 'Not a member of that shop' } },
  { method: 'get', path: '/api/shops/{shopId}/billing', summary: 'Plan, state, trial, usage and the plans to choose from', tag: 'billing', auth: true, params: shopIdParamsSchema, response: billingOverviewSchema, errors: ownerOnly },
  {
    method: 'post',
    path: '/api/shops/{shopId}/billing/checkout',
    summary: 'Start Stripe Checkout for a plan; answers the page to open',
    tag: 'billing',
    auth: true,
    params: shopIdParamsSchema,
    body: checkoutRequestSchema,
    response: redirectResponseSchema,
    errors: { ...ownerOnly, 409: 'Already subscribed: use the billing portal' },
  },
  {
    method: 'post',
    path: '/api/shops/{shopId}/billing/portal',
    summary: "Open Stripe's billing portal (card, plan, cancellation); answers the page to open",
    tag: 'billing',
    auth: true,
    params: shopIdParamsSchema,
    response: redirectResponseSchema,
    errors: { ...ownerOnly, 409: 'Not subscribed yet' },
  },
  { method: 'get', path: '/api/shops/{shopId}/support-access', summary: 'Support-access grants and everything support did in the shop', tag: 'support access', auth: true, params: shopIdParamsSchema, response: supportAccessResponseSchema, errors: ownerOnly },
  {
    method: 'post',
    path: '/api/shops/{shopId}/support-access',
    summary: 'Let platform support see the shop for a number of hours (replaces an active grant)',
    tag: 'support access',
    auth: true,
    params: shopIdParamsSchema,
    body: grantSupportAccessRequestSchema,
    response: supportGrantSchema,
    status: 201,
    errors: ownerOnly,
  },
  { method: 'delete', path: '/api/shops/{shopId}/support-access', summary: 'End support access now', tag: 'support access', auth: true, params: shopIdParamsSchema, response: okResponseSchema, errors: { ...ownerOnly, 404: 'No active grant' } },
];
