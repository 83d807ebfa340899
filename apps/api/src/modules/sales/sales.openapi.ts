import { z } from 'zod';
import {
  cardCheckoutResponseSchema,
  cardCheckoutSchema,
  counterSaleSchema,
  createInvoiceSchema,
  creditNoteSchema,
  invoiceFromJobSchema,
  invoiceFromVehicleSchema,
  invoiceListQuerySchema,
  invoiceListResponseSchema,
  invoiceParamsSchema,
  invoiceSchema,
  partPriceParamsSchema,
  payTokenParamsSchema,
  recordPaymentSchema,
  salesSettingsSchema,
  sellPricesQuerySchema,
  sellPricesResponseSchema,
  setListPriceSchema,
  shopIdParamsSchema,
  updateInvoiceSchema,
  updateSalesSettingsSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const member = { 404: 'Not a member of that shop, or no such record in it' };
const owner = { 403: 'Owners only', ...member };
const withEmailed = invoiceSchema.extend({ emailed: z.boolean() });
const tag = 'sales';

/** OpenAPI entries of the sales routes (issue 12). Tax rounding: docs/decisions/015-sales-prices-and-tax-rounding.md. */
export const salesRouteDocs: RouteDoc[] = [
  { method: 'get', path: '/api/shops/{shopId}/sales/settings', summary: 'Pricing rules, tax rounding and tax rates', tag, auth: true, params: shopIdParamsSchema, response: salesSettingsSchema, errors: member },
  { method: 'put', path: '/api/shops/{shopId}/sales/settings', summary: 'Change pricing rules, tax rounding or the extra tax rates', tag, auth: true, params: shopIdParamsSchema, body: updateSalesSettingsSchema, response: salesSettingsSchema, errors: owner },
  {
    method: 'get',
    path: '/api/shops/{shopId}/sales/sell-prices',
    summary: 'Sell prices of parts under the pricing rules; unit cost and margin only for roles that may see them (not mechanics)',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    query: sellPricesQuerySchema,
    response: sellPricesResponseSchema,
    errors: member,
  },
  { method: 'put', path: '/api/shops/{shopId}/sales/parts/{partId}/list-price', summary: 'Set or clear a part’s list price', tag, auth: true, params: partPriceParamsSchema, body: setListPriceSchema, response: sellPricesResponseSchema, errors: owner },
  { method: 'get', path: '/api/shops/{shopId}/sales/invoices', summary: 'Invoices and credit notes, by status, customer and period', tag, auth: true, params: shopIdParamsSchema, query: invoiceListQuerySchema, response: invoiceListResponseSchema, errors: member },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices', summary: 'A draft invoice with lines typed in (part lines take their sell price unless priced)', tag, auth: true, params: shopIdParamsSchema, body: createInvoiceSchema, response: invoiceSchema, status: 201, errors: { ...owner, 409: 'A part line has no price to take' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/from-job', summary: 'A draft invoice from a job: its issued parts at sell prices and its labour', tag, auth: true, params: shopIdParamsSchema, body: invoiceFromJobSchema, response: invoiceSchema, status: 201, errors: { ...owner, 409: 'The job already has an invoice' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/from-vehicle', summary: 'A draft invoice for the sale of a shop-stock vehicle (marked sold when issued)', tag, auth: true, params: shopIdParamsSchema, body: invoiceFromVehicleSchema, response: invoiceSchema, status: 201, errors: { ...owner, 409: 'Not shop stock, or already sold' } },
  {
    method: 'post',
    path: '/api/shops/{shopId}/sales/counter-sales',
    summary: 'A counter sale: the stock issued and the invoice made (and by default issued and e-mailed) in one transaction',
    tag,
    auth: true,
    params: shopIdParamsSchema,
    body: counterSaleSchema,
    response: withEmailed,
    status: 201,
    errors: { ...owner, 409: 'Not enough free stock, or no price' },
  },
  { method: 'get', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}', summary: 'An invoice or credit note with lines, tax per rate, payments, paid and due', tag, auth: true, params: invoiceParamsSchema, response: invoiceSchema, errors: member },
  { method: 'patch', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}', summary: 'Change a draft (customer, notes, lines; line prices may be set by hand)', tag, auth: true, params: invoiceParamsSchema, body: updateInvoiceSchema, response: invoiceSchema, errors: { ...owner, 409: 'Issued: correct it with a credit note' } },
  { method: 'delete', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}', summary: 'Delete a draft (never an issued invoice)', tag, auth: true, params: invoiceParamsSchema, response: z.null(), status: 204, errors: { ...owner, 409: 'Issued, a counter sale, or a deposit is recorded' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/issue', summary: 'Issue a draft: the next number of the shop’s series, without gaps; e-mailed when the customer has an address', tag, auth: true, params: invoiceParamsSchema, body: z.object({ sendEmail: z.boolean().optional() }).strict(), response: withEmailed, errors: { ...owner, 409: 'Already issued, no lines, or the vehicle cannot be sold yet' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/credit-notes', summary: 'A credit note against an issued invoice, in full or by lines (issued at once, CN- series)', tag, auth: true, params: invoiceParamsSchema, body: creditNoteSchema, response: withEmailed, status: 201, errors: { ...owner, 409: 'Not issued, or more than is left to credit' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/payments', summary: 'Record a cash or bank-transfer payment (a deposit on a draft, or a part payment); never more than is due', tag, auth: true, params: invoiceParamsSchema, body: recordPaymentSchema, response: invoiceSchema, status: 201, errors: { ...owner, 409: 'More than is due' } },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/card-checkout', summary: 'Open a one-off Stripe Checkout session for (part of) what is due; the payment is recorded from the signed webhook', tag, auth: true, params: invoiceParamsSchema, body: cardCheckoutSchema, response: cardCheckoutResponseSchema, errors: { ...owner, 409: 'Not issued, or more than is due' } },
  { method: 'get', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/pdf', summary: 'The invoice or credit note as PDF, with tax per rate', tag, auth: true, params: invoiceParamsSchema, response: z.string(), responseType: 'application/pdf', errors: member },
  { method: 'post', path: '/api/shops/{shopId}/sales/invoices/{invoiceId}/email', summary: 'E-mail the PDF (with the pay link while something is due) to the customer', tag, auth: true, params: invoiceParamsSchema, response: z.object({ emailed: z.literal(true) }), errors: { ...owner, 409: 'No e-mail address', 502: 'The mail server refused' } },
  { method: 'get', path: '/api/pay/{token}', summary: 'The customer’s pay link (no account): redirects (303) to a Stripe Checkout page for what is due, or says it is paid', tag, auth: false, params: payTokenParamsSchema, response: z.string(), responseType: '*/*', errors: { 404: 'Unknown link' } },
  { method: 'get', path: '/api/pay/{token}/done', summary: 'Where Stripe sends the customer back: whether the invoice is paid', tag, auth: false, params: payTokenParamsSchema, response: z.string(), responseType: '*/*', errors: { 404: 'Unknown link' } },
];
