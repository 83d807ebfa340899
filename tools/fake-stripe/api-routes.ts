// The `/v1` API the SDK talks to: authentication, idempotency keys, the endpoints and their
// parameters, list pagination and expansion.
import express, { type NextFunction, type Request, type Response, type Router } from 'express';
import type { FakeBilling, RequestInfo } from './billing.ts';
import { FakeStripeError, invalid, noSuch } from './errors.ts';
import { expand } from './expand.ts';
import * as P from './params.ts';
import { type FakeStripeStore, type WireList, newId } from './store.ts';

const MAX_IDEMPOTENCY_KEYS = 10_000;

interface ListParams {
  limit?: number;
  starting_after?: string;
  ending_before?: string;
}

/** Newest first, cut by Stripe's cursor parameters. */
function page<T extends { id: string }>(newestFirst: T[], p: ListParams, url: string): WireList<T> {
  let items = newestFirst;
  if (p.starting_after) {
    const i = items.findIndex((x) => x.id === p.starting_after);
    if (i < 0) throw invalid('starting_after', `No such object: '${p.starting_after}'`, 'resource_missing');
    items = items.slice(i + 1);
  } else if (p.ending_before) {
    const i = items.findIndex((x) => x.id === p.ending_before);
    if (i < 0) throw invalid('ending_before', `No such object: '${p.ending_before}'`, 'resource_missing');
    items = items.slice(0, i);
    const limit = p.limit ?? 10;
    return { object: 'list', data: items.slice(Math.max(0, items.length - limit)), has_more: items.length > limit, url };
  }
  const limit = p.limit ?? 10;
  return { object: 'list', data: items.slice(0, limit), has_more: items.length > limit, url };
}

function newestFirst<T>(values: Iterable<T>): T[] {
  return [...values].reverse();
}

function requestInfo(res: Response, req: Request): RequestInfo {
  return { id: String(res.getHeader('Request-Id') ?? '') || null, idempotencyKey: req.get('Idempotency-Key') ?? null };
}

/** `Authorization: Bearer sk_…`; live keys are refused so that a real secret never lands here. */
function authenticate(req: Request, _res: Response, next: NextFunction): void {
  const match = /^Bearer (sk_[A-Za-z0-9_]{4,255})$/.exec(req.get('Authorization') ?? '');
  if (!match) {
    throw new FakeStripeError(401, 'api_key_missing', 'You did not provide a valid API key. Send Authorization: Bearer sk_test_… (any test key works with the local fake).');
  }
  if (match[1]!.startsWith('sk_live_')) {
    throw new FakeStripeError(401, 'api_key_live', 'This is a local test stand-in: it refuses live keys. Use a test key such as sk_test_local.');
  }
  next();
}

/** Same Idempotency-Key and parameters → the stored response again; other parameters → 400. */
function idempotency(store: FakeStripeStore) {
  return (req: Request, res: Response, next: NextFunction): void => {
    const key = req.get('Idempotency-Key');
    if (req.method !== 'POST' || !key) return next();
    if (key.length > 255) throw invalid('Idempotency-Key', 'Idempotency keys are at most 255 characters.');
    const fingerprint = `${req.method} ${req.path} ${JSON.stringify(req.body ?? {})}`;
    const seen = store.idempotency.get(key);
    if (seen) {
      if (seen.fingerprint !== fingerprint) {
        throw new FakeStripeError(
          400,
          'idempotency_key_in_use',
          `Keys for idempotent requests can only be used with the same parameters they were first used with. Use a key other than '${key}' for a different request.`,
          undefined,
          'idempotency_error',
        );
      }
      if (seen.inFlight) throw new FakeStripeError(409, 'idempotency_key_in_use', 'A request with this idempotency key is still running.', undefined, 'idempotency_error');
      res.set('Idempotent-Replayed', 'true');
      res.status(seen.status).json(seen.body);
      return;
    }
    if (store.idempotency.size >= MAX_IDEMPOTENCY_KEYS) {
      const oldest = store.idempotency.keys().next().value;
      if (oldest !== undefined) store.idempotency.delete(oldest);
    }
    const entry = { fingerprint, status: 0, body: null as unknown, inFlight: true };
    store.idempotency.set(key, entry);
    const json = res.json.bind(res);
    res.json = (body: unknown) => {
      // Like Stripe, only results of requests that ran are kept; refused ones may be retried.
      if (res.statusCode < 400) Object.assign(entry, { status: res.statusCode, body, inFlight: false });
      else store.idempotency.delete(key);
      return json(body);
    };
    next();
  };
}

/** Builds the `/v1` router. */
export function apiRouter(store: FakeStripeStore, billing: FakeBilling, publicUrl: () => string): Router {
  const r = express.Router();
  const resolve = (id: string) => billing.resolveForExpand(id);

  r.use((_req, res, next) => {
    res.set('Request-Id', newId('req', 14));
    next();
  });
  r.use(authenticate);
  r.use(idempotency(store));

  // ------------------------------------------------------------ customers
  r.post('/customers', (req, res) => {
    const p = P.parse(P.customerCreate, req.body);
    res.json(expand(structuredClone(billing.createCustomer(p)), p.expand, resolve));
  });
  r.get('/customers/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(expand(structuredClone(billing.customer(req.params.id)), p.expand, resolve));
  });
  r.post('/customers/:id', (req, res) => {
    const p = P.parse(P.customerUpdate, req.body);
    res.json(expand(structuredClone(billing.updateCustomer(req.params.id, p)), p.expand, resolve));
  });

  // ------------------------------------------------------------ products
  r.post('/products', (req, res) => {
    const p = P.parse(P.productCreate, req.body);
    res.json(expand(structuredClone(billing.createProduct(p)), p.expand, resolve));
  });
  r.get('/products', (req, res) => {
    const p = P.parse(P.productList, req.query);
    const all = newestFirst(store.products.values()).filter((x) => p.active === undefined || x.active === p.active);
    res.json(expand(structuredClone(page(all, p, '/v1/products')), p.expand, resolve));
  });
  r.get('/products/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(expand(structuredClone(billing.product(req.params.id)), p.expand, resolve));
  });
  r.post('/products/:id', (req, res) => {
    const p = P.parse(P.productUpdate, req.body);
    res.json(expand(structuredClone(billing.updateProduct(req.params.id, p)), p.expand, resolve));
  });

  // ------------------------------------------------------------ prices
  r.post('/prices', (req, res) => {
    const p = P.parse(P.priceCreate, req.body);
    res.json(expand(structuredClone(billing.createPrice(p)), p.expand, resolve));
  });
  r.get('/prices', (req, res) => {
    const p = P.parse(P.priceList, req.query);
    const all = newestFirst(store.prices.values()).filter(
      (x) =>
        (p.active === undefined || x.active === p.active) &&
        (p.currency === undefined || x.currency === p.currency) &&
        (p.product === undefined || x.product === p.product) &&
        (p.type === undefined || x.type === p.type) &&
        (p.lookup_keys === undefined || (x.lookup_key !== null && p.lookup_keys.includes(x.lookup_key))),
    );
    res.json(expand(structuredClone(page(all, p, '/v1/prices')), p.expand, resolve));
  });
  r.get('/prices/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(expand(structuredClone(billing.price(req.params.id)), p.expand, resolve));
  });
  r.post('/prices/:id', (req, res) => {
    const p = P.parse(P.priceUpdate, req.body);
    res.json(expand(structuredClone(billing.updatePrice(req.params.id, p)), p.expand, resolve));
  });

  // ------------------------------------------------------------ checkout sessions
  const renderSession = (id: string, paths: string[] | undefined) => {
    const rec = billing.checkoutRecord(id);
    const session: Record<string, unknown> = billing.renderCheckoutSession(rec);
    const rest = (paths ?? []).filter((path) => path !== 'line_items');
    if (rest.length !== (paths ?? []).length) {
      session.line_items = { object: 'list', data: billing.checkoutLineItems(rec), has_more: false, url: `/v1/checkout/sessions/${id}/line_items` };
    }
    return expand(session, rest, resolve);
  };
  r.post('/checkout/sessions', (req, res) => {
    const p = P.parse(P.checkoutSessionCreate, req.body);
    const rec = billing.createCheckoutSession(p);
    res.json(renderSession(rec.session.id, p.expand));
  });
  r.get('/checkout/sessions', (req, res) => {
    const p = P.parse(P.checkoutSessionList, req.query);
    const all = newestFirst(store.checkoutSessions.values())
      .map((rec) => billing.renderCheckoutSession(rec))
      .filter(
        (s) =>
          (p.customer === undefined || s.customer === p.customer) &&
          (p.subscription === undefined || s.subscription === p.subscription) &&
          (p.status === undefined || s.status === p.status),
      );
    res.json(expand(page(all, p, '/v1/checkout/sessions'), p.expand, resolve));
  });
  r.get('/checkout/sessions/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(renderSession(req.params.id, p.expand));
  });
  r.get('/checkout/sessions/:id/line_items', (req, res) => {
    const p = P.parse(P.lineItemList, req.query);
    const rec = billing.checkoutRecord(req.params.id);
    res.json(expand(page(billing.checkoutLineItems(rec), p, `/v1/checkout/sessions/${rec.session.id}/line_items`), p.expand, resolve));
  });
  r.post('/checkout/sessions/:id/expire', (req, res) => {
    const p = P.parse(P.expandOnly, req.body);
    const rec = billing.checkoutRecord(req.params.id);
    if (billing.renderCheckoutSession(rec).status !== 'open') throw invalid('session', 'Only open checkout sessions can be expired.', 'checkout_session_not_open');
    rec.session.status = 'expired';
    res.json(renderSession(rec.session.id, p.expand));
  });

  // ------------------------------------------------------------ subscriptions
  r.get('/subscriptions', (req, res) => {
    const p = P.parse(P.subscriptionList, req.query);
    const all = newestFirst(store.subscriptions.values())
      .filter((s) => {
        if (p.customer !== undefined && s.customer !== p.customer) return false;
        if (p.price !== undefined && !s.items.some((it) => it.price === p.price)) return false;
        if (p.status === undefined) return s.status !== 'canceled' && s.status !== 'incomplete_expired';
        if (p.status === 'all') return true;
        if (p.status === 'ended') return s.status === 'canceled' || s.status === 'incomplete_expired';
        return s.status === p.status;
      })
      .map((s) => billing.renderSubscription(s));
    res.json(expand(page(all, p, '/v1/subscriptions'), p.expand, resolve));
  });
  r.get('/subscriptions/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(expand(billing.renderSubscription(billing.subscriptionRecord(req.params.id)), p.expand, resolve));
  });
  r.post('/subscriptions/:id', (req, res) => {
    const p = P.parse(P.subscriptionUpdate, req.body);
    const { subscription } = billing.updateSubscription(req.params.id, p, requestInfo(res, req));
    res.json(expand(subscription, p.expand, resolve));
  });
  r.delete('/subscriptions/:id', (req, res) => {
    // The SDK sends DELETE parameters in the query string.
    const p = P.parse(P.subscriptionCancel, { ...(req.query as object), ...((req.body as object | undefined) ?? {}) });
    const { subscription } = billing.cancelSubscription(req.params.id, p, requestInfo(res, req));
    res.json(expand(subscription, p.expand, resolve));
  });

  // ------------------------------------------------------------ billing portal
  r.post('/billing_portal/sessions', (req, res) => {
    const p = P.parse(P.portalSessionCreate, req.body);
    billing.customer(p.customer, 'customer');
    const id = newId('bps');
    const session = {
      id,
      object: 'billing_portal.session' as const,
      configuration: p.configuration ?? 'bpc_localdefault',
      created: Math.floor(Date.now() / 1000),
      customer: p.customer,
      customer_account: null,
      flow: null,
      livemode: false,
      locale: null,
      on_behalf_of: null,
      return_url: p.return_url ?? null,
      url: `${publicUrl()}/portal/${id}`,
    };
    store.portalSessions.set(id, { session, formToken: newId('tok', 32) });
    res.json(expand(structuredClone(session), p.expand, resolve));
  });

  // ------------------------------------------------------------ invoices
  r.get('/invoices', (req, res) => {
    const p = P.parse(P.invoiceList, req.query);
    const all = newestFirst(store.invoices.values()).filter(
      (i) =>
        (p.customer === undefined || i.customer === p.customer) &&
        (p.subscription === undefined || i.parent?.subscription_details.subscription === p.subscription) &&
        (p.status === undefined || i.status === p.status) &&
        (p.collection_method === undefined || i.collection_method === p.collection_method),
    );
    res.json(expand(structuredClone(page(all, p, '/v1/invoices')), p.expand, resolve));
  });
  r.get('/invoices/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    res.json(expand(structuredClone(billing.invoice(req.params.id)), p.expand, resolve));
  });
  r.post('/invoices/:id/pay', (req, res) => {
    const p = P.parse(P.invoicePay, req.body);
    const { paid, invoice } = billing.payInvoice(req.params.id, requestInfo(res, req));
    if (!paid) throw new FakeStripeError(402, 'card_declined', 'Your card was declined. (A payment failure was requested through the test controls.)', undefined, 'card_error');
    res.json(expand(structuredClone(invoice), p.expand, resolve));
  });

  // ------------------------------------------------------------ payment intents, methods, events
  r.get('/payment_intents/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    const pi = store.paymentIntents.get(req.params.id);
    if (!pi) throw noSuch('pi', req.params.id);
    res.json(expand(structuredClone(pi), p.expand, resolve));
  });
  r.get('/payment_methods/:id', (req, res) => {
    const p = P.parse(P.expandOnly, req.query);
    const pm = store.paymentMethods.get(req.params.id);
    if (!pm) throw noSuch('pm', req.params.id);
    res.json(expand(structuredClone(pm), p.expand, resolve));
  });
  r.get('/events/:id', (req, res) => {
    P.parse(P.expandOnly, req.query);
    const rec = store.events.find((e) => e.event.id === req.params.id);
    if (!rec) throw noSuch('evt', req.params.id);
    res.json(rec.event);
  });

  r.use((req) => {
    throw new FakeStripeError(404, 'unrecognized_request_url', `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). The local fake does not serve this endpoint.`);
  });
  return r;
}
