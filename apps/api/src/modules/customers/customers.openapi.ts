import { customerIdParamsSchema, customerInputSchema, customerListQuerySchema, customerListResponseSchema, customerSchema, customerUpdateSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'customers';
const read = { 404: 'Not a member of that shop, or no such customer in it' };
const write = { 403: 'Not allowed for this role (the owner keeps customer records)', 404: 'Not a member of that shop, or no such customer in it' };
const base = (path: string) => `/api/shops/{shopId}/customers${path}`;

/** The customers routes for the OpenAPI document. */
export const customerRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'List customers (search by name, e-mail or phone; up to 100 a page)', tag, auth: true, params: shopIdParamsSchema, query: customerListQuerySchema, response: customerListResponseSchema, errors: read },
  { method: 'post', path: base(''), summary: 'Add a customer', tag, auth: true, params: shopIdParamsSchema, body: customerInputSchema, response: customerSchema, status: 201, errors: write },
  { method: 'get', path: base('/{customerId}'), summary: 'One customer', tag, auth: true, params: customerIdParamsSchema, response: customerSchema, errors: read },
  { method: 'patch', path: base('/{customerId}'), summary: 'Change a customer', tag, auth: true, params: customerIdParamsSchema, body: customerUpdateSchema, response: customerSchema, errors: write },
];
