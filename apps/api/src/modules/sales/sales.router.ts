import { Router, type Request } from 'express';
import { z } from 'zod';
import {
  cardCheckoutSchema,
  counterSaleSchema,
  createInvoiceSchema,
  creditNoteSchema,
  invoiceFromJobSchema,
  invoiceFromVehicleSchema,
  invoiceListQuerySchema,
  invoiceParamsSchema,
  partPriceParamsSchema,
  payTokenParamsSchema,
  recordPaymentSchema,
  sellPricesQuerySchema,
  setListPriceSchema,
  shopIdParamsSchema,
  updateInvoiceSchema,
  updateSalesSettingsSchema,
} from '@tappet/contracts';
import { formatMoney } from '@tappet/domain';
import { subjectOf } from '@tappet/permissions';
import { forbidden } from '../../lib/http-error';
import type { Clock } from '../../lib/clock';
import type { RateLimitRule, RateLimitStore } from '../../lib/rate-limiter';
import { addressRateLimit } from '../../middleware/rate-limits';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { InvoiceListFilters, SalesService } from './sales.service';

const shopIdOf = (req: Request) => shopOf(req).shop.id;
const invoiceIdOf = (req: Request) => req.params['invoiceId'] as string;

/** May the caller see costs and margins (a mechanic may not)? */
const seesMargin = (req: Request) => shopOf(req).ability.can('read', subjectOf('Invoice', { shopId: shopIdOf(req) }), 'margin');
const seesCost = (req: Request) => shopOf(req).ability.can('read', subjectOf('Part', { shopId: shopIdOf(req) }), 'unitCostMinor');

/** Setting a line's price by hand is its own permission (field `unitPriceMinor` of an invoice). */
function authorizePriceOverride(req: Request, lines: ReadonlyArray<{ unitPriceMinor?: number }> | undefined): void {
  if (!lines?.some((l) => l.unitPriceMinor !== undefined)) return;
  if (!shopOf(req).ability.can('update', subjectOf('Invoice', { shopId: shopIdOf(req) }), 'unitPriceMinor')) throw forbidden('Your role does not allow you to set line prices by hand.');
}

const issueBodySchema = z.object({ sendEmail: z.boolean().default(true) }).strict();

/**
 * /api/shops/:shopId/sales: sales settings (pricing rules, tax), sell prices, list prices,
 * invoices and credit notes, payments, counter sales. Everyone in the shop reads; the owner
 * issues, credits and records payments (libs/permissions).
 */
export function salesRouter(deps: { sales: SalesService }): Router {
  const { sales } = deps;
  const router = Router({ mergeParams: true });

  router.get('/settings', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Settings');
    res.json(await sales.settings(shopIdOf(req)));
  });
  router.put('/settings', validate({ params: shopIdParamsSchema, body: updateSalesSettingsSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    res.json(await sales.updateSettings(shopIdOf(req), bodyOf(updateSalesSettingsSchema, req), auditActorOf(req)));
  });

  router.get('/sell-prices', validate({ params: shopIdParamsSchema, query: sellPricesQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    const { partIds } = req.query as unknown as z.output<typeof sellPricesQuerySchema>;
    res.json(await sales.sellPrices(shopIdOf(req), partIds, seesCost(req)));
  });
  router.put('/parts/:partId/list-price', validate({ params: partPriceParamsSchema, body: setListPriceSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    const partId = req.params['partId'] as string;
    await sales.setListPrice(shopIdOf(req), partId, bodyOf(setListPriceSchema, req).listPriceMinor, auditActorOf(req));
    res.json(await sales.sellPrices(shopIdOf(req), [partId], seesCost(req)));
  });

  router.get('/invoices', validate({ params: shopIdParamsSchema, query: invoiceListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Invoice');
    res.json(await sales.list(shopIdOf(req), req.query as unknown as InvoiceListFilters));
  });
  router.post('/invoices', validate({ params: shopIdParamsSchema, body: createInvoiceSchema }), async (req, res) => {
    authorize(req, 'create', 'Invoice');
    const body = bodyOf(createInvoiceSchema, req);
    authorizePriceOverride(req, body.lines);
    const id = await sales.create(shopIdOf(req), body, auditActorOf(req));
    res.status(201).json(await sales.get(shopIdOf(req), id, seesMargin(req)));
  });
  router.post('/invoices/from-job', validate({ params: shopIdParamsSchema, body: invoiceFromJobSchema }), async (req, res) => {
    authorize(req, 'create', 'Invoice');
    const id = await sales.createFromJob(shopIdOf(req), bodyOf(invoiceFromJobSchema, req).jobId, auditActorOf(req));
    res.status(201).json(await sales.get(shopIdOf(req), id, seesMargin(req)));
  });
  router.post('/invoices/from-vehicle', validate({ params: shopIdParamsSchema, body: invoiceFromVehicleSchema }), async (req, res) => {
    authorize(req, 'create', 'Invoice');
    const id = await sales.createFromVehicle(shopIdOf(req), bodyOf(invoiceFromVehicleSchema, req), auditActorOf(req));
    res.status(201).json(await sales.get(shopIdOf(req), id, seesMargin(req)));
  });
  router.post('/counter-sales', validate({ params: shopIdParamsSchema, body: counterSaleSchema }), async (req, res) => {
    authorize(req, 'create', 'Invoice');
    authorize(req, 'issue', 'Stock');
    const body = bodyOf(counterSaleSchema, req);
    authorizePriceOverride(req, body.lines);
    if (body.issue) authorize(req, 'issue', 'Invoice');
    const { invoiceId, emailed } = await sales.counterSale(shopIdOf(req), body, auditActorOf(req));
    const sent = emailed ? await emailed : false;
    res.status(201).json({ ...(await sales.get(shopIdOf(req), invoiceId, seesMargin(req))), emailed: sent });
  });

  router.get('/invoices/:invoiceId', validate({ params: invoiceParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Invoice');
    res.json(await sales.get(shopIdOf(req), invoiceIdOf(req), seesMargin(req)));
  });
  router.patch('/invoices/:invoiceId', validate({ params: invoiceParamsSchema, body: updateInvoiceSchema }), async (req, res) => {
    authorize(req, 'update', 'Invoice');
    const body = bodyOf(updateInvoiceSchema, req);
    authorizePriceOverride(req, body.lines);
    await sales.update(shopIdOf(req), invoiceIdOf(req), body, auditActorOf(req));
    res.json(await sales.get(shopIdOf(req), invoiceIdOf(req), seesMargin(req)));
  });
  router.delete('/invoices/:invoiceId', validate({ params: invoiceParamsSchema }), async (req, res) => {
    authorize(req, 'delete', 'Invoice');
    await sales.remove(shopIdOf(req), invoiceIdOf(req), auditActorOf(req));
    res.status(204).end();
  });
  router.post('/invoices/:invoiceId/issue', validate({ params: invoiceParamsSchema, body: issueBodySchema }), async (req, res) => {
    authorize(req, 'issue', 'Invoice');
    const { emailed } = await sales.issue(shopIdOf(req), invoiceIdOf(req), auditActorOf(req), bodyOf(issueBodySchema, req).sendEmail);
    const sent = emailed ? await emailed : false;
    res.json({ ...(await sales.get(shopIdOf(req), invoiceIdOf(req), seesMargin(req))), emailed: sent });
  });
  router.post('/invoices/:invoiceId/credit-notes', validate({ params: invoiceParamsSchema, body: creditNoteSchema }), async (req, res) => {
    authorize(req, 'issue', 'Invoice');
    const { creditNoteId, emailed } = await sales.creditNote(shopIdOf(req), invoiceIdOf(req), bodyOf(creditNoteSchema, req), auditActorOf(req));
    const sent = emailed ? await emailed : false;
    res.status(201).json({ ...(await sales.get(shopIdOf(req), creditNoteId, seesMargin(req))), emailed: sent });
  });
  router.post('/invoices/:invoiceId/payments', validate({ params: invoiceParamsSchema, body: recordPaymentSchema }), async (req, res) => {
    authorize(req, 'create', 'Payment');
    await sales.recordPayment(shopIdOf(req), invoiceIdOf(req), bodyOf(recordPaymentSchema, req), auditActorOf(req));
    res.status(201).json(await sales.get(shopIdOf(req), invoiceIdOf(req), seesMargin(req)));
  });
  router.post('/invoices/:invoiceId/card-checkout', validate({ params: invoiceParamsSchema, body: cardCheckoutSchema }), async (req, res) => {
    authorize(req, 'create', 'Payment');
    res.json(await sales.cardCheckout(shopIdOf(req), invoiceIdOf(req), bodyOf(cardCheckoutSchema, req).amountMinor, auditActorOf(req)));
  });
  router.get('/invoices/:invoiceId/pdf', validate({ params: invoiceParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Invoice');
    const pdf = await sales.pdf(shopIdOf(req), invoiceIdOf(req));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${pdf.filename}"`);
    res.send(pdf.content);
  });
  router.post('/invoices/:invoiceId/email', validate({ params: invoiceParamsSchema }), async (req, res) => {
    authorize(req, 'send', 'Invoice');
    const invoice = await sales.get(shopIdOf(req), invoiceIdOf(req), false);
    if (!invoice.customerEmail) {
      res.status(409).json({ error: { code: 'conflict', message: 'The customer has no e-mail address on this invoice.', details: { reason: 'no_email' } } });
      return;
    }
    const sent = await sales.email(shopIdOf(req), invoiceIdOf(req), auditActorOf(req));
    if (!sent) {
      res.status(502).json({ error: { code: 'internal', message: 'The e-mail could not be sent. Try again later.' } });
      return;
    }
    res.json({ emailed: true });
  });
  return router;
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(title)}</title></head><body><main><h1>${escapeHtml(title)}</h1>${body}</main></body></html>`;
}

/**
 * /api/pay/:token: the customer's pay link from the invoice e-mail (no account). Opens a Stripe
 * Checkout session for what is due; `/done` is where Stripe sends the customer back. The payment
 * itself is recorded only from the signed webhook.
 */
/** Visits to customers' pay links per address. */
export const defaultPayLinkLimit: RateLimitRule = { limit: 60, windowMs: 15 * 60_000 };

export function payLinkRouter(deps: { sales: SalesService; clock: Clock; store: RateLimitStore; limit?: RateLimitRule }): Router {
  const router = Router();
  // Each visit may open a Stripe Checkout session: a per-address limit keeps a script from piling them up.
  router.use(addressRateLimit({ name: 'pay-link', rule: deps.limit ?? defaultPayLinkLimit, clock: deps.clock, store: deps.store }));
  router.get('/:token', validate({ params: payTokenParamsSchema }), async (req, res) => {
    const result = await deps.sales.payLink(req.params['token'] as string);
    if ('url' in result) {
      res.redirect(303, result.url);
      return;
    }
    res.type('html').send(page(`Invoice ${result.number ?? ''} is paid`, '<p>Nothing is due on this invoice. Thank you.</p>'));
  });
  router.get('/:token/done', validate({ params: payTokenParamsSchema }), async (req, res) => {
    const state = await deps.sales.payLinkState(req.params['token'] as string);
    const body =
      state.dueMinor <= 0
        ? `<p>Thank you: invoice ${escapeHtml(state.number ?? '')} from ${escapeHtml(state.shopName)} is paid.</p>`
        : `<p>${escapeHtml(formatMoney(state.dueMinor, state.currency))} is due on invoice ${escapeHtml(state.number ?? '')}. If you have just paid, the payment is being confirmed: reload this page in a moment.</p>`;
    res.type('html').send(page('Invoice payment', body));
  });
  return router;
}
