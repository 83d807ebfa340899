// Test controls under `/_test/`. They are not part of Stripe's API and exist only in the fake:
// force payment failures, move subscriptions through time, inspect and resend events, reset.
import express, { type Router } from 'express';
import type { Emitted, FakeBilling } from './billing.ts';
import { invalid, noSuch } from './errors.ts';
import * as P from './params.ts';
import type { EventRecord, FakeStripeStore } from './store.ts';

export interface TestRoutesOptions {
  store: FakeStripeStore;
  billing: FakeBilling;
  settle: (emitted: Emitted) => Promise<void>;
  reset: () => void;
}

function summary(r: EventRecord) {
  return { id: r.event.id, type: r.event.type, created: r.event.created, delivery: r.delivery };
}

function failuresView(store: FakeStripeStore) {
  return { global: store.failures.global, customers: Object.fromEntries(store.failures.customers) };
}

/** Builds the `/_test` router (expects JSON bodies). */
export function testRouter({ store, billing, settle, reset }: TestRoutesOptions): Router {
  const r = express.Router();

  r.post('/fail-next-payment', (req, res) => {
    const p = P.parse(P.failNextPayment, req.body);
    const count = p.count ?? 1;
    if (p.customer) {
      billing.customer(p.customer, 'customer');
      store.failures.customers.set(p.customer, (store.failures.customers.get(p.customer) ?? 0) + count);
    } else {
      store.failures.global += count;
    }
    res.json(failuresView(store));
  });
  r.delete('/fail-next-payment', (_req, res) => {
    store.failures.global = 0;
    store.failures.customers.clear();
    res.json(failuresView(store));
  });

  r.post('/subscriptions/:id/advance', async (req, res) => {
    const p = P.parse(P.advance, req.body);
    const outcome = p.to === 'renewal' ? billing.renew(req.params.id) : p.to === 'past_due' ? billing.makePastDue(req.params.id) : billing.makeUnpaid(req.params.id);
    await settle(outcome.emitted);
    res.json({ subscription: outcome.subscription, invoice: outcome.invoice, events: outcome.emitted.events.map(summary) });
  });

  r.post('/invoices/:id/pay', async (req, res) => {
    const { paid, invoice, emitted } = billing.payInvoice(req.params.id);
    await settle(emitted);
    res.json({ paid, invoice, events: emitted.events.map(summary) });
  });

  r.get('/events', (req, res) => {
    const type = typeof req.query.type === 'string' ? req.query.type : undefined;
    const data = store.events.filter((e) => !type || e.event.type === type).map((e) => ({ ...summary(e), event: e.event }));
    res.json({ object: 'list', data });
  });

  r.post('/resend/:eventId', async (req, res) => {
    const record = store.events.find((e) => e.event.id === req.params.eventId);
    if (!record) throw noSuch('evt', req.params.eventId, 'eventId');
    if (record.delivery.status === 'disabled') throw invalid('eventId', 'No webhook URL is configured, so there is nowhere to send it.', 'webhooks_disabled');
    await settle({ events: [record], delivered: billing.resend(record.event.id) });
    res.json(summary(record));
  });

  r.post('/reset', (_req, res) => {
    reset();
    res.json({ ok: true });
  });

  return r;
}
