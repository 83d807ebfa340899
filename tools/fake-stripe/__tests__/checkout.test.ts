// Checkout through the hosted page, the webhooks it sends and their signatures, one-off payments,
// declines and the Cancel button.
import type Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type FakeStripe, startFakeStripe } from '../server.ts';
import { type WebhookReceiver, TEST_CARD, control, formOf, payCheckout, postForm, sdkFor, startReceiver } from './helpers.ts';

const SECRET = 'whsec_test_checkout';
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
});
afterAll(async () => {
  await fake.close();
  await receiver.close();
});

async function subscriptionCheckout(extra: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
  const product = await stripe.products.create({ name: 'Workshop' });
  const price = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 4900, recurring: { interval: 'month' }, lookup_key: 'workshop_monthly' });
  const customer = await stripe.customers.create({ email: 'owner@harbour-works.test', name: 'Harbour Works' });
  const session = await stripe.checkout.sessions.create({
    mode: 'subscription',
    customer: customer.id,
    line_items: [{ price: price.id, quantity: 1 }],
    success_url: 'http://localhost:3000/billing/done?session_id={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://localhost:3000/billing',
    client_reference_id: 'shop_harbour',
    metadata: { shopId: 'shop_harbour' },
    ...extra,
  });
  return { product, price, customer, session };
}

function verified(): Stripe.Event[] {
  return receiver.received.map((w) => stripe.webhooks.constructEvent(w.rawBody, w.signature, SECRET));
}

describe('subscription checkout', () => {
  it('creates an open session whose url serves a labelled checkout page', async () => {
    const { session } = await subscriptionCheckout();
    expect(session).toMatchObject({ object: 'checkout.session', mode: 'subscription', status: 'open', payment_status: 'unpaid', amount_total: 4900, currency: 'gbp', client_reference_id: 'shop_harbour' });
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.url).toBe(`${fake.url}/checkout/${session.id}`);
    const res = await fetch(session.url!);
    const html = await res.text();
    expect(res.status).toBe(200);
    expect(html).toContain('TEST STAND-IN');
    expect(html).toContain('Workshop');
    expect(html).toContain('£49.00');
    for (const id of ['name', 'card_number', 'expiry', 'cvc']) expect(html).toMatch(new RegExp(`<label for="${id}">`));
    expect(html).toMatch(/<button type="submit" class="primary">Pay<\/button>/);
    expect(html).toMatch(/<button type="submit" class="secondary">Cancel<\/button>/);
  });

  it('Pay creates an active subscription and a paid invoice, sends signed webhooks, then redirects to success_url', async () => {
    const { session, customer, price } = await subscriptionCheckout();
    const pageToken = formOf(await (await fetch(session.url!)).text(), '/pay').token;
    const res = await payCheckout(session.url!);
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`http://localhost:3000/billing/done?session_id=${session.id}`);

    const events = verified();
    expect(events.map((e) => e.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    const completed = events[2]!.data.object as Stripe.Checkout.Session;
    expect(completed).toMatchObject({ id: session.id, status: 'complete', payment_status: 'paid', client_reference_id: 'shop_harbour', metadata: { shopId: 'shop_harbour' }, customer: customer.id });

    const retrieved = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription'] });
    const sub = retrieved.subscription as Stripe.Subscription;
    expect(sub).toMatchObject({ object: 'subscription', status: 'active', customer: customer.id, cancel_at_period_end: false });
    expect(sub.id).toMatch(/^sub_/);
    const item = sub.items.data[0]!;
    expect(item.price.id).toBe(price.id);
    const month = 28 * 86_400;
    expect(item.current_period_end - item.current_period_start).toBeGreaterThanOrEqual(month);
    expect(item.current_period_end).toBeGreaterThan(Date.now() / 1000 + month - 60);

    const invoices = await stripe.invoices.list({ subscription: sub.id });
    expect(invoices.data).toHaveLength(1);
    const invoice = invoices.data[0]!;
    expect(invoice).toMatchObject({ status: 'paid', amount_paid: 4900, amount_due: 4900, billing_reason: 'subscription_create', customer: customer.id });
    expect(invoice.id).toMatch(/^in_/);
    expect(invoice.parent?.subscription_details?.subscription).toBe(sub.id);
    expect((await stripe.invoices.retrieve(invoice.id)).id).toBe(invoice.id);

    // Once complete, the session has no url and the page says so instead of taking a second payment.
    expect(retrieved.url).toBeNull();
    expect(await (await fetch(`${fake.url}/checkout/${session.id}`)).text()).toContain('already paid');
    const again = await postForm(fake.url, `/checkout/${session.id}/pay`, { token: pageToken, ...TEST_CARD });
    expect(again.status).toBe(200);
    expect(fake.store.subscriptions.size).toBe(1);
    expect(receiver.received).toHaveLength(3);
  });

  it('rejects a tampered webhook body and a wrong secret', async () => {
    const { session } = await subscriptionCheckout();
    await payCheckout(session.url!);
    const w = receiver.received[0]!;
    expect(() => stripe.webhooks.constructEvent(w.rawBody, w.signature, SECRET)).not.toThrow();
    const tampered = w.rawBody.replace('"active"', '"canceled"');
    expect(tampered).not.toBe(w.rawBody);
    expect(() => stripe.webhooks.constructEvent(tampered, w.signature, SECRET)).toThrow(/signature/i);
    expect(() => stripe.webhooks.constructEvent(w.rawBody, w.signature, 'whsec_someone_else')).toThrow(/signature/i);
  });

  it('starts a trial when asked: trialing, nothing charged today', async () => {
    const { session } = await subscriptionCheckout({ subscription_data: { trial_period_days: 14, metadata: { plan: 'workshop' } } });
    expect(session.amount_total).toBe(0);
    expect(await (await fetch(session.url!)).text()).toContain('Free trial for 14 days');
    await payCheckout(session.url!);
    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription.latest_invoice'] });
    const sub = done.subscription as Stripe.Subscription;
    expect(done.payment_status).toBe('no_payment_required');
    expect(sub).toMatchObject({ status: 'trialing', metadata: { plan: 'workshop' } });
    expect(sub.trial_end! - sub.trial_start!).toBe(14 * 86_400);
    expect(sub.items.data[0]!.current_period_end).toBe(sub.trial_end);
    expect(sub.latest_invoice as Stripe.Invoice).toMatchObject({ amount_due: 0, status: 'paid' });
  });

  it('creates the customer from the e-mail typed on the page when the session has none', async () => {
    const product = await stripe.products.create({ name: 'Garage' });
    const price = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 9900, recurring: { interval: 'month' } });
    const session = await stripe.checkout.sessions.create({ mode: 'subscription', line_items: [{ price: price.id }], success_url: 'http://localhost:3000/ok' });
    const refused = await payCheckout(session.url!, { email: 'nope' });
    expect(refused.status).toBe(422);
    expect(await refused.text()).toMatch(/aria-invalid="true"[\s\S]*Enter an e-mail address/);
    const ok = await payCheckout(session.url!, { email: 'owner@brackenfold-garage.test' });
    expect(ok.status).toBe(303);
    const done = await stripe.checkout.sessions.retrieve(session.id);
    const customer = (await stripe.customers.retrieve(done.customer as string)) as Stripe.Customer;
    expect(customer.email).toBe('owner@brackenfold-garage.test');
  });

  it('Cancel redirects to cancel_url and leaves the session open', async () => {
    const { session } = await subscriptionCheckout();
    const html = await (await fetch(session.url!)).text();
    const { action, token } = formOf(html, '/cancel');
    const res = await postForm(session.url!, action, { token });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe('http://localhost:3000/billing');
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
    expect(receiver.received).toHaveLength(0);
  });

  it('refuses a form post without the page token', async () => {
    const { session } = await subscriptionCheckout();
    const res = await postForm(session.url!, `/checkout/${session.id}/pay`, { token: 'forged', ...TEST_CARD });
    expect(res.status).toBe(403);
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
  });

  it('declines the card when a failure is pending for the customer: no subscription, no events', async () => {
    const { session, customer } = await subscriptionCheckout();
    expect((await control(fake.url, 'POST', '/fail-next-payment', { customer: customer.id })).status).toBe(200);
    const declined = await payCheckout(session.url!);
    expect(declined.status).toBe(402);
    expect(await declined.text()).toMatch(/role="alert"[\s\S]*declined/);
    expect(fake.store.subscriptions.size).toBe(0);
    expect(receiver.received).toHaveLength(0);
    // The failure was used up: the next try goes through.
    expect((await payCheckout(session.url!)).status).toBe(303);
  });

  it('refuses a recurring price in payment mode and mixed currencies', async () => {
    const product = await stripe.products.create({ name: 'Workshop' });
    const monthly = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 100, recurring: { interval: 'month' } });
    await expect(stripe.checkout.sessions.create({ mode: 'payment', line_items: [{ price: monthly.id }], success_url: 'http://localhost:3000/ok' })).rejects.toMatchObject({
      statusCode: 400,
      param: 'line_items[0][price]',
    });
    const euros = await stripe.prices.create({ product: product.id, currency: 'eur', unit_amount: 100, recurring: { interval: 'month' } });
    await expect(
      stripe.checkout.sessions.create({ mode: 'subscription', line_items: [{ price: monthly.id }, { price: euros.id }], success_url: 'http://localhost:3000/ok' }),
    ).rejects.toMatchObject({ statusCode: 400, param: 'line_items[1][price]' });
    expect(fake.store.checkoutSessions.size).toBe(0);
  });
});

describe('page safety', () => {
  it('escapes names that came through the API', async () => {
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'gbp', unit_amount: 100, product_data: { name: '<img src=x onerror=alert(1)>' } } }],
      success_url: 'http://localhost:3000/ok',
    });
    const res = await fetch(session.url!);
    const html = await res.text();
    expect(html).not.toContain('<img src=x');
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
    expect(res.headers.get('content-security-policy')).toContain("default-src 'none'");
  });
});

describe('one-off payment checkout', () => {
  it('takes price_data line items, marks the session paid and records a succeeded payment intent', async () => {
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'gbp', unit_amount: 2500, product_data: { name: 'Extra catalogue import' } }, quantity: 2 }],
      success_url: 'http://localhost:3000/paid?cs={CHECKOUT_SESSION_ID}',
      payment_intent_data: { metadata: { shopId: 'shop_brackenfold' } },
      customer_email: 'owner@brackenfold-garage.test',
    });
    expect(session.amount_total).toBe(5000);
    const line = await stripe.checkout.sessions.listLineItems(session.id);
    expect(line.data[0]).toMatchObject({ quantity: 2, amount_total: 5000, description: 'Extra catalogue import' });

    const res = await payCheckout(session.url!);
    expect(res.headers.get('location')).toBe(`http://localhost:3000/paid?cs=${session.id}`);
    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', subscription: null });
    expect(done.payment_intent as Stripe.PaymentIntent).toMatchObject({ status: 'succeeded', amount: 5000, amount_received: 5000, currency: 'gbp', metadata: { shopId: 'shop_brackenfold' } });
    expect(verified().map((e) => e.type)).toEqual(['checkout.session.completed']);
  });
});

describe('one-off payment checkout for an invoice (sales, issue 12)', () => {
  it('sends the session’s metadata, amount and mode in the signed checkout.session.completed event, and nothing before the page is paid', async () => {
    const metadata = { purpose: 'tappet_invoice_payment', shopId: 'shop_elmcroft', invoiceId: 'inv_0042' };
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'gbp', unit_amount: 14400, product_data: { name: 'Invoice INV-00042' } } }],
      success_url: 'http://localhost:3000/shops/x/sales/invoices/y?paid=card',
      cancel_url: 'http://localhost:3000/shops/x/sales/invoices/y',
      client_reference_id: 'shop_elmcroft',
      customer_email: 'payer@elmcroft.test',
      metadata,
      payment_intent_data: { metadata, description: 'Invoice INV-00042' },
    });
    expect(verified()).toEqual([]);
    const res = await payCheckout(session.url!);
    expect(res.status).toBe(303);
    const [event] = verified();
    expect(event?.type).toBe('checkout.session.completed');
    const completed = event!.data.object as Stripe.Checkout.Session;
    expect(completed).toMatchObject({ id: session.id, mode: 'payment', payment_status: 'paid', amount_total: 14400, metadata, subscription: null });
    // The page no longer offers the payment form, so it cannot be paid twice.
    expect(await (await fetch(session.url!)).text()).not.toMatch(/<form method="post" action="[^"]+\/pay"/);
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('complete');
  });
});
