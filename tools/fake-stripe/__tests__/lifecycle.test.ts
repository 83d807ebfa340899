// After checkout: the billing portal, renewals and failed payments through the test controls,
// cancellation, and webhook delivery bookkeeping (retries that stop, resend).
import type Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type FakeStripe, startFakeStripe } from '../server.ts';
import { type WebhookReceiver, control, formOf, payCheckout, postForm, sdkFor, startReceiver, waitFor } from './helpers.ts';

const SECRET = 'whsec_test_lifecycle';
let fake: FakeStripe;
let stripe: Stripe;
let receiver: WebhookReceiver;

beforeAll(async () => {
  receiver = await startReceiver();
  fake = await startFakeStripe({ port: 0, webhookUrl: receiver.url, webhookSecret: SECRET, webhookRetryDelaysMs: [20, 40] });
  stripe = sdkFor(fake.port);
});
beforeEach(() => {
  fake.reset();
  receiver.received.length = 0;
  receiver.respondWith = 200;
  receiver.failNext = 0;
});
afterAll(async () => {
  await fake.close();
  await receiver.close();
});

function events(): Stripe.Event[] {
  return receiver.received.map((w) => stripe.webhooks.constructEvent(w.rawBody, w.signature, SECRET));
}
function typesSince(n: number): string[] {
  return events()
    .slice(n)
    .map((e) => e.type);
}

/** A customer with an active monthly subscription bought through the checkout page. */
async function subscribed() {
  const product = await stripe.products.create({ name: 'Workshop', metadata: { family: 'tappet' } });
  const monthly = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 4900, recurring: { interval: 'month' }, lookup_key: 'workshop_monthly' });
  const bigger = await stripe.products.create({ name: 'Restoration hall', metadata: { family: 'tappet' } });
  const hall = await stripe.prices.create({ product: bigger.id, currency: 'gbp', unit_amount: 12900, recurring: { interval: 'month' }, lookup_key: 'hall_monthly' });
  const unrelated = await stripe.products.create({ name: 'Sticker sheet', metadata: { family: 'merch' } });
  await stripe.prices.create({ product: unrelated.id, currency: 'gbp', unit_amount: 300, recurring: { interval: 'month' } });
  const customer = await stripe.customers.create({ email: 'owner@harbour-works.test', name: 'Harbour Works' });
  const session = await stripe.checkout.sessions.create({ mode: 'subscription', customer: customer.id, line_items: [{ price: monthly.id }], success_url: 'http://localhost:3000/ok' });
  await payCheckout(session.url!);
  const subId = (await stripe.checkout.sessions.retrieve(session.id)).subscription as string;
  return { customer, monthly, hall, subId, sent: receiver.received.length };
}

async function openPortal(customer: string) {
  const portal = await stripe.billingPortal.sessions.create({ customer, return_url: 'http://localhost:3000/settings/billing' });
  const html = await (await fetch(portal.url)).text();
  return { portal, html };
}

describe('billing portal', () => {
  it('creates a session whose page shows the subscription and the way back', async () => {
    const { customer } = await subscribed();
    const { portal, html } = await openPortal(customer.id);
    expect(portal.id).toMatch(/^bps_/);
    expect(portal).toMatchObject({ object: 'billing_portal.session', customer: customer.id, return_url: 'http://localhost:3000/settings/billing' });
    expect(html).toContain('TEST STAND-IN');
    expect(html).toContain('Workshop');
    expect(html).toContain('Active');
    expect(html).toContain('href="http://localhost:3000/settings/billing"');
  });

  it('switches to another price of the same family only, and reports it as an update', async () => {
    const { customer, hall, subId, sent } = await subscribed();
    const { portal, html } = await openPortal(customer.id);
    expect(html).toContain('Restoration hall');
    expect(html).not.toContain('Sticker sheet');
    const { action, token } = formOf(html, '/switch');
    const res = await postForm(portal.url, action, { token, price: hall.id });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`/portal/${portal.id}?done=switched`);
    const sub = await stripe.subscriptions.retrieve(subId);
    expect(sub.items.data[0]!.price.id).toBe(hall.id);
    const updated = events()[sent] as Stripe.CustomerSubscriptionUpdatedEvent;
    expect(updated.type).toBe('customer.subscription.updated');
    expect(updated.data.previous_attributes).toHaveProperty('items');
  });

  it('cancels at period end, and can undo it', async () => {
    const { customer, subId } = await subscribed();
    const { portal, html } = await openPortal(customer.id);
    const cancel = formOf(html, '/cancel-at-period-end');
    await postForm(portal.url, cancel.action, { token: cancel.token });
    const sub = await stripe.subscriptions.retrieve(subId);
    expect(sub).toMatchObject({ status: 'active', cancel_at_period_end: true, cancel_at: sub.items.data[0]!.current_period_end });
    const again = await (await fetch(portal.url)).text();
    const resume = formOf(again, '/resume');
    await postForm(portal.url, resume.action, { token: resume.token });
    expect((await stripe.subscriptions.retrieve(subId)).cancel_at_period_end).toBe(false);
  });

  it('cancels now only with the confirmation ticked', async () => {
    const { customer, subId, sent } = await subscribed();
    const { portal, html } = await openPortal(customer.id);
    const form = formOf(html, '/cancel-now');
    expect((await postForm(portal.url, form.action, { token: form.token })).status).toBe(400);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
    expect((await postForm(portal.url, form.action, { token: form.token, confirm: 'yes' })).status).toBe(303);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('canceled');
    expect(typesSince(sent)).toEqual(['customer.subscription.deleted']);
  });

  it("refuses to act on another customer's subscription", async () => {
    const { subId } = await subscribed();
    const stranger = await stripe.customers.create({ email: 'owner@brackenfold-garage.test' });
    const { portal, html } = await openPortal(stranger.id);
    expect(html).not.toContain(subId);
    const token = /name="token" value="([^"]+)"/.exec(html)?.[1] ?? '';
    const res = await postForm(portal.url, `/portal/${portal.id}/subscriptions/${subId}/cancel-now`, { token, confirm: 'yes' });
    expect(res.status).toBe(404);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
  });
});

describe('renewal and failed payments', () => {
  it('renewal pays a new invoice and moves the period on', async () => {
    const { subId, sent } = await subscribed();
    const before = await stripe.subscriptions.retrieve(subId);
    const res = await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'renewal' });
    expect(res.status).toBe(200);
    expect(typesSince(sent)).toEqual(['invoice.paid', 'customer.subscription.updated']);
    const after = await stripe.subscriptions.retrieve(subId);
    expect(after.status).toBe('active');
    expect(after.items.data[0]!.current_period_start).toBe(before.items.data[0]!.current_period_end);
    const invoices = await stripe.invoices.list({ subscription: subId });
    expect(invoices.data.map((i) => [i.billing_reason, i.status])).toEqual([
      ['subscription_cycle', 'paid'],
      ['subscription_create', 'paid'],
    ]);
  });

  it('fail-next-payment + renewal → invoice.payment_failed and past_due; paying the invoice restores active', async () => {
    const { customer, subId, sent } = await subscribed();
    await control(fake.url, 'POST', '/fail-next-payment', { customer: customer.id });
    await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'renewal' });
    expect(typesSince(sent)).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
    const failed = events()[sent]!.data.object as Stripe.Invoice;
    expect(failed).toMatchObject({ status: 'open', attempt_count: 1, amount_paid: 0 });
    expect(failed.parent?.subscription_details?.subscription).toBe(subId);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('past_due');

    // The portal offers to pay the open invoice.
    const { portal, html } = await openPortal(customer.id);
    expect(html).toContain('Payment overdue');
    const pay = formOf(html, `/invoices/${failed.id}/pay`);
    expect((await postForm(portal.url, pay.action, { token: pay.token })).headers.get('location')).toContain('done=paid');
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
    expect((await stripe.invoices.retrieve(failed.id)).status).toBe('paid');
    expect(typesSince(sent + 2)).toEqual(['invoice.paid', 'customer.subscription.updated']);
  });

  it('a global failure flag hits whichever payment comes next, once', async () => {
    const { subId } = await subscribed();
    await control(fake.url, 'POST', '/fail-next-payment', {});
    await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'renewal' });
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('past_due');
    const open = (await stripe.invoices.list({ subscription: subId, status: 'open' })).data[0]!;
    const paid = await stripe.invoices.pay(open.id);
    expect(paid.status).toBe('paid');
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
  });

  it('invoices.pay with a pending failure answers a card error', async () => {
    const { customer, subId } = await subscribed();
    await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'past_due' });
    const open = (await stripe.invoices.list({ customer: customer.id, status: 'open' })).data[0]!;
    await control(fake.url, 'POST', '/fail-next-payment', { customer: customer.id });
    await expect(stripe.invoices.pay(open.id)).rejects.toMatchObject({ type: 'StripeCardError', statusCode: 402 });
    expect((await stripe.invoices.retrieve(open.id)).attempt_count).toBe(2);
  });

  it('advance to past_due then unpaid', async () => {
    const { subId, sent } = await subscribed();
    const pastDue = await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'past_due' });
    expect((pastDue.json.subscription as Stripe.Subscription).status).toBe('past_due');
    expect(typesSince(sent)).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
    const unpaid = await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'unpaid' });
    expect((unpaid.json.subscription as Stripe.Subscription).status).toBe('unpaid');
    expect(typesSince(sent + 2)).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('unpaid');
  });

  it('renewal of a subscription set to cancel at period end ends it', async () => {
    const { subId, sent } = await subscribed();
    await stripe.subscriptions.update(subId, { cancel_at_period_end: true });
    await waitFor(() => receiver.received.length === sent + 1);
    await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'renewal' });
    expect(typesSince(sent)).toEqual(['customer.subscription.updated', 'customer.subscription.deleted']);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('canceled');
  });

  it('refuses advance on an unknown subscription and an unknown target', async () => {
    expect((await control(fake.url, 'POST', '/subscriptions/sub_nothere/advance', { to: 'renewal' })).status).toBe(404);
    const { subId } = await subscribed();
    const bad = await control(fake.url, 'POST', `/subscriptions/${subId}/advance`, { to: 'next_year' });
    expect(bad.status).toBe(400);
    expect(bad.json).toMatchObject({ error: { type: 'invalid_request_error', param: 'to' } });
  });
});

describe('subscriptions through the API', () => {
  it('changes the price and lists by customer', async () => {
    const { customer, hall, subId } = await subscribed();
    const sub = await stripe.subscriptions.retrieve(subId);
    const updated = await stripe.subscriptions.update(subId, { items: [{ id: sub.items.data[0]!.id, price: hall.id }], proration_behavior: 'none', metadata: { plan: 'hall' } });
    expect(updated.items.data.map((i) => i.price.id)).toEqual([hall.id]);
    expect(updated.metadata).toEqual({ plan: 'hall' });
    const list = await stripe.subscriptions.list({ customer: customer.id });
    expect(list.data.map((s) => s.id)).toEqual([subId]);
  });

  it('cancel ends it now, sends customer.subscription.deleted, and drops it from the default list', async () => {
    const { customer, subId, sent } = await subscribed();
    const canceled = await stripe.subscriptions.cancel(subId, { cancellation_details: { comment: 'Closing the workshop' } });
    expect(canceled).toMatchObject({ status: 'canceled', cancellation_details: { comment: 'Closing the workshop', reason: 'cancellation_requested' } });
    expect(canceled.ended_at).not.toBeNull();
    await waitFor(() => receiver.received.length > sent);
    const deleted = events()[sent]!;
    expect(deleted.type).toBe('customer.subscription.deleted');
    expect((deleted.data.object as Stripe.Subscription).status).toBe('canceled');
    expect((await stripe.subscriptions.list({ customer: customer.id })).data).toEqual([]);
    expect((await stripe.subscriptions.list({ customer: customer.id, status: 'all' })).data.map((s) => s.id)).toEqual([subId]);
    await expect(stripe.subscriptions.update(subId, { cancel_at_period_end: true })).rejects.toMatchObject({ statusCode: 400 });
    await expect(stripe.subscriptions.cancel(subId)).rejects.toMatchObject({ statusCode: 400 });
  });

  it('an update that changes nothing sends no event', async () => {
    const { subId, sent } = await subscribed();
    await stripe.subscriptions.update(subId, { cancel_at_period_end: false });
    await stripe.customers.create({}); // a later request, so a stray event would have been sent by now
    await new Promise((r) => setImmediate(r));
    expect(receiver.received.length).toBe(sent);
    expect(fake.store.events.length).toBe(sent);
  });
});

describe('webhook delivery', () => {
  it('lists sent events with their delivery status', async () => {
    await subscribed();
    const res = await control(fake.url, 'GET', '/events');
    const data = res.json.data as { id: string; type: string; delivery: { status: string; attempts: unknown[] } }[];
    expect(data.map((e) => e.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    expect(data.every((e) => e.id.startsWith('evt_') && e.delivery.status === 'delivered' && e.delivery.attempts.length === 1)).toBe(true);
  });

  it('retries a failed delivery with backoff and then gives up', async () => {
    receiver.respondWith = 500;
    await subscribed();
    await waitFor(() => fake.store.events.every((e) => e.delivery.status === 'failed'));
    const record = fake.store.events[0]!;
    // One first attempt plus one per configured retry delay, and no more.
    for (const e of fake.store.events) expect(e.delivery.attempts.map((a) => a.status)).toEqual([500, 500, 500]);
    // Each retry waits at least its configured delay (20 ms, then 40 ms) after the previous attempt ended.
    const gaps = record.delivery.attempts.slice(1).map((a, i) => a.at - record.delivery.attempts[i]!.at);
    expect(gaps[0]!).toBeGreaterThanOrEqual(19);
    expect(gaps[1]!).toBeGreaterThanOrEqual(39);
    expect(record.delivery.nextAttemptAt).toBeNull();
    const count = receiver.received.length;
    await new Promise((r) => setTimeout(r, 100));
    expect(receiver.received.length).toBe(count);
  });

  it('a retry that succeeds marks the event delivered', async () => {
    // Checkout sends three events one after the other; the first attempt of each meets the outage.
    receiver.failNext = 3;
    await subscribed();
    await waitFor(() => fake.store.events.every((e) => e.delivery.status === 'delivered'));
    const attempts = fake.store.events.map((e) => e.delivery.attempts.map((a) => a.status));
    expect(attempts[0]![0]).toBe(503);
    expect(attempts.flat().filter((s) => s === 503)).toHaveLength(3);
    for (const a of attempts) expect(a.at(-1)).toBe(200);
  });

  it('resends an event on request, signed afresh', async () => {
    await subscribed();
    const first = fake.store.events[0]!.event.id;
    const res = await control(fake.url, 'POST', `/resend/${first}`);
    expect(res.status).toBe(200);
    const last = receiver.received.at(-1)!;
    expect(stripe.webhooks.constructEvent(last.rawBody, last.signature, SECRET).id).toBe(first);
    expect((await control(fake.url, 'POST', '/resend/evt_nothere')).status).toBe(404);
  });
});
