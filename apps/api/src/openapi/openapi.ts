import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import {
  errorBodySchema,
  healthResponseSchema,
  okResponseSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  shopDetailSchema,
  shopIdParamsSchema,
  signInRequestSchema,
  meWithActiveShopSchema,
  setActiveShopRequestSchema,
  shopListResponseSchema,
  updateShopRequestSchema,
} from '@tappet/contracts';
import { catalogueRouteDocs } from '../modules/catalogue/catalogue.openapi';
import { lookupRouteDocs } from '../modules/lookup/lookup.openapi';
import { stockRouteDocs } from '../modules/stock/stock.openapi';
import { staffRouteDocs } from '../modules/staff/staff.openapi';
import { apiKeyRouteDocs } from '../modules/api-keys/api-keys.openapi';
import { auditRouteDocs } from '../modules/audit/audit.openapi';
import { settingsRouteDocs } from '../modules/settings/settings.openapi';
import { labelRouteDocs } from '../modules/labels/labels.openapi';
import { shopExportRouteDocs } from '../modules/shop-export/shop-export.openapi';
import { estimateRouteDocs } from '../modules/estimates/estimates.openapi';
import { consignmentRouteDocs } from '../modules/consignment/consignment.openapi';
import { salesReportRouteDocs } from '../modules/sales-reports/sales-reports.openapi';
import { purchasingRouteDocs } from '../modules/purchasing/purchasing.openapi';
import { customerRouteDocs } from '../modules/customers/customers.openapi';
import { vehicleRouteDocs } from '../modules/vehicles/vehicles.openapi';
import { jobRouteDocs } from '../modules/jobs/jobs.openapi';
import { countRouteDocs } from '../modules/counts/counts.openapi';
import { barcodeRouteDocs } from '../modules/barcodes/barcodes.openapi';
import { billingRouteDocs } from '../modules/billing/billing.openapi';
import { platformRouteDocs } from '../modules/platform/platform.openapi';
import { createTestShopRequestSchema, createTestShopResponseSchema } from '../modules/test-support/test-support.router';
import { salesRouteDocs } from '../modules/sales/sales.openapi';

type Method = RouteConfig['method'];

export interface RouteDoc {
  method: Method;
  /** OpenAPI path, `{param}` style. */
  path: string;
  summary: string;
  tag: string;
  auth: boolean;
  params?: z.ZodObject;
  body?: z.ZodType;
  response: z.ZodType;
  status?: number;
  /** Body media type when not JSON (file uploads). */
  bodyType?: 'multipart/form-data';
  /** Response media type when not JSON (CSV exports). */
  responseType?: 'text/csv' | 'application/zip' | 'application/pdf' | 'image/jpeg' | '*/*';
  /** Query string schema. */
  query?: z.ZodObject;
  /** False for a write that takes no X-CSRF header (Stripe's webhook). */
  csrf?: false;
  /** Error statuses worth listing beyond the ones every route has. */
  errors?: Record<number, string>;
}

const json = (schema: z.ZodType) => ({ 'application/json': { schema } });

/** Every API route with its contracts. `app.test`-style checks compare it with the mounted routes. */
export function apiRoutes(options: { testSupport: boolean }): RouteDoc[] {
  const routes: RouteDoc[] = [
    { method: 'get', path: '/api/health', summary: 'Liveness check', tag: 'system', auth: false, response: healthResponseSchema },
    { method: 'get', path: '/api/openapi.json', summary: 'This document', tag: 'system', auth: false, response: z.looseObject({}) },
    {
      method: 'post',
      path: '/api/auth/sign-in',
      summary: 'Sign in; sets the session cookie and returns the me payload',
      tag: 'auth',
      auth: false,
      body: signInRequestSchema,
      response: meWithActiveShopSchema,
      errors: { 401: 'Wrong e-mail address or password', 403: 'Account deactivated', 429: 'Too many failed attempts (see Retry-After)' },
    },
    { method: 'post', path: '/api/auth/sign-out', summary: 'Sign out; ends the session', tag: 'auth', auth: true, response: okResponseSchema },
    {
      method: 'post',
      path: '/api/auth/password-reset/request',
      summary: 'E-mail a single-use reset link (same answer whether or not the address exists)',
      tag: 'auth',
      auth: false,
      body: passwordResetRequestSchema,
      response: okResponseSchema,
      errors: { 429: 'Too many requests (see Retry-After)' },
    },
    {
      method: 'post',
      path: '/api/auth/password-reset/confirm',
      summary: 'Set a new password with a reset token; ends every session of the user',
      tag: 'auth',
      auth: false,
      body: passwordResetConfirmSchema,
      response: okResponseSchema,
    },
    { method: 'get', path: '/api/me', summary: 'The signed-in person, their memberships and active shop', tag: 'me', auth: true, response: meWithActiveShopSchema },
    {
      method: 'post',
      path: '/api/me/active-shop',
      summary: 'Switch the active shop',
      tag: 'me',
      auth: true,
      body: setActiveShopRequestSchema,
      response: meWithActiveShopSchema,
      errors: { 404: 'Not a member of that shop' },
    },
    { method: 'get', path: '/api/shops', summary: 'My shops with my role in each', tag: 'shops', auth: true, response: shopListResponseSchema },
    {
      method: 'get',
      path: '/api/shops/{shopId}',
      summary: 'One of my shops',
      tag: 'shops',
      auth: true,
      params: shopIdParamsSchema,
      response: shopDetailSchema,
      errors: { 404: 'Not a member of that shop' },
    },
    {
      method: 'patch',
      path: '/api/shops/{shopId}',
      summary: 'Rename a shop (owner only)',
      tag: 'shops',
      auth: true,
      params: shopIdParamsSchema,
      body: updateShopRequestSchema,
      response: shopDetailSchema,
      errors: { 403: 'Not allowed for this role', 404: 'Not a member of that shop' },
    },
    ...catalogueRouteDocs,
    ...lookupRouteDocs,
    ...stockRouteDocs,
    ...staffRouteDocs,
    ...apiKeyRouteDocs,
    ...auditRouteDocs,
    ...settingsRouteDocs,
    ...labelRouteDocs,
    ...shopExportRouteDocs,
    ...purchasingRouteDocs,
    ...customerRouteDocs,
    ...vehicleRouteDocs,
    ...jobRouteDocs,
    ...countRouteDocs,
    ...barcodeRouteDocs,
    ...billingRouteDocs,
    ...salesRouteDocs,
    ...estimateRouteDocs,
    ...consignmentRouteDocs,
    ...salesReportRouteDocs,
    ...platformRouteDocs,
  ];
  if (options.testSupport) {
    routes.push({
      method: 'post',
      path: '/api/test-support/shops',
      summary: 'Test mode only: create a shop with users for the given roles',
      tag: 'test-support',
      auth: false,
      body: createTestShopRequestSchema,
      response: createTestShopResponseSchema,
      status: 201,
    });
  }
  return routes;
}

/** Builds the OpenAPI 3.1 document from the zod contracts. */
export function buildOpenApiDocument(options: { testSupport: boolean; serverUrl: string }) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'sessionCookie', {
    type: 'apiKey',
    in: 'cookie',
    name: 'tappet_session',
    description: 'Session cookie set by sign-in (`__Host-tappet_session` when served over https).',
  });
  registry.registerComponent('securitySchemes', 'apiKey', {
    type: 'http',
    scheme: 'bearer',
    description: 'An API key (`tpk_…`) created by an owner; acts in its own shop as a viewer or buyer. Needs no X-CSRF header when sent without cookies.',
  });
  const csrfHeader = z.object({ 'x-csrf': z.literal('1').meta({ description: 'Required on every request that changes data.' }) });

  for (const route of apiRoutes(options)) {
    const changesData = route.method !== 'get' && route.method !== 'head';
    const responses: RouteConfig['responses'] = {
      [route.status ?? 200]: { description: 'Success', content: route.responseType ? { [route.responseType]: { schema: route.response } } : json(route.response) },
      400: { description: 'Invalid input (validation_failed, bad_request)', content: json(errorBodySchema) },
    };
    if (route.auth) responses[401] = { description: 'Not signed in', content: json(errorBodySchema) };
    if (changesData) responses[403] = { description: 'CSRF check failed (csrf_rejected) or not allowed', content: json(errorBodySchema) };
    for (const [status, description] of Object.entries(route.errors ?? {})) {
      responses[Number(status)] = { description, content: json(errorBodySchema) };
    }
    registry.registerPath({
      method: route.method,
      path: route.path,
      summary: route.summary,
      tags: [route.tag],
      // Keys work only inside their own shop: other routes take the session alone.
      security: route.auth ? (route.path.startsWith('/api/shops/{shopId}') ? [{ sessionCookie: [] }, { apiKey: [] }] : [{ sessionCookie: [] }]) : undefined,
      request: {
        params: route.params,
        headers: changesData && route.csrf !== false ? csrfHeader : undefined,
        query: route.query,
        body: route.body ? { required: true, content: route.bodyType ? { [route.bodyType]: { schema: route.body } } : json(route.body) } : undefined,
      },
      responses,
    });
  }

  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Tappet API',
      version: '0.1.0',
      description: 'Parts, stock, purchasing, vehicles and jobs for classic-vehicle restoration shops. Errors answer `{ error: { code, message, details } }`.',
    },
    servers: [{ url: options.serverUrl }],
  });
}
