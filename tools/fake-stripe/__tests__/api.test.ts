// The /v1 API as the official SDK sees it: catalogue, lookup keys and expansion, authentication,
// idempotency keys, Stripe-shaped errors and reset.
import type Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type FakeStripe, startFakeStripe } from '../server.ts';
import { control, sdkFor } from './helpers.ts';

let fake: FakeStripe;
let stripe: Stripe;

beforeAll(async () => {
  fake = await startFakeStripe({
    port: 0,
    webhookUrl: null,
    webhookSecret: 'whsec_test_api',
    catalogue: [{ product: { name: 'Seeded bench plan' }, prices: [{ lookup_key: 'seeded_monthly', currency: 'gbp', unit_amount: 1900, recurring: { interval: 'month' } }] }],
  });
  stripe = sdkFor(fake.port);
});
beforeEach(() => fake.reset());
afterAll(() => fake.close());

async function planPrice(lookupKey = 'workshop_monthly', amount = 4900) {
  const product = await stripe.products.create({ name: 'Workshop', metadata: { family: 'tappet-plans' } });
  const price = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: amount, recurring: { interval: 'month' }, lookup_key: lookupKey });
  return { product, price };
}

describe('catalogue', () => {
  it('creates a product and a price with a lookup key, in Stripe id style', async () => {
    const { product, price } = await planPrice();
    expect(product.id).toMatch(/^prod_[A-Za-z0-9]+$/);
    expect(price).toMatchObject({ object: 'price', product: product.id, unit_amount: 4900, currency: 'gbp', type: 'recurring', lookup_key: 'workshop_monthly', active: true });
    expect(price.id).toMatch(/^price_[A-Za-z0-9]{24}$/);
    expect(price.recurring).toMatchObject({ interval: 'month', interval_count: 1 });
    // The SDK turns the decimal string into its Decimal type, which only works if the wire value is well-formed.
    expect(String(price.unit_amount_decimal)).toBe('4900');
  });

  it('lists prices by lookup key with the product expanded', async () => {
    const { product, price } = await planPrice();
    await planPrice('garage_monthly', 9900);
    const list = await stripe.prices.list({ lookup_keys: ['workshop_monthly'], expand: ['data.product'] });
    expect(list.data.map((p) => p.id)).toEqual([price.id]);
    const expanded = list.data[0]!.product as Stripe.Product;
    expect(expanded).toMatchObject({ id: product.id, object: 'product', name: 'Workshop' });
  });

  it('lists several lookup keys and leaves the product as an id without expand', async () => {
    await planPrice('a_key', 100);
    await planPrice('b_key', 200);
    const list = await stripe.prices.list({ lookup_keys: ['a_key', 'b_key', 'missing_key'] });
    expect(list.data.map((p) => p.lookup_key).sort()).toEqual(['a_key', 'b_key']);
    expect(typeof list.data[0]!.product).toBe('string');
  });

  it('refuses a lookup key that is taken, unless asked to transfer it', async () => {
    const { price: first, product } = await planPrice('taken_key');
    await expect(stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 1, recurring: { interval: 'month' }, lookup_key: 'taken_key' })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      param: 'lookup_key',
    });
    const moved = await stripe.prices.create({ product: product.id, currency: 'gbp', unit_amount: 1, recurring: { interval: 'month' }, lookup_key: 'taken_key', transfer_lookup_key: true });
    expect((await stripe.prices.retrieve(first.id)).lookup_key).toBeNull();
    expect((await stripe.prices.list({ lookup_keys: ['taken_key'] })).data.map((p) => p.id)).toEqual([moved.id]);
  });

  it('lists products newest first and pages with starting_after', async () => {
    const a = await stripe.products.create({ name: 'A' });
    const b = await stripe.products.create({ name: 'B' });
    const first = await stripe.products.list({ limit: 1 });
    expect(first.data.map((p) => p.id)).toEqual([b.id]);
    expect(first.has_more).toBe(true);
    const next = await stripe.products.list({ limit: 1, starting_after: b.id });
    expect(next.data.map((p) => p.id)).toEqual([a.id]);
  });

  it('updates a customer and keeps metadata semantics (empty value removes a key)', async () => {
    const c = await stripe.customers.create({ email: 'owner@harbour-works.test', metadata: { shopId: 'shop_1', keep: 'yes' } });
    expect(c.id).toMatch(/^cus_/);
    const updated = await stripe.customers.update(c.id, { name: 'Harbour Works', metadata: { shopId: '' } });
    expect(updated).toMatchObject({ name: 'Harbour Works', email: 'owner@harbour-works.test', metadata: { keep: 'yes' } });
    expect((await stripe.customers.retrieve(c.id)) as Stripe.Customer).toMatchObject({ name: 'Harbour Works' });
  });

  it('seeds the configured catalogue at start and again after reset', async () => {
    const list = await stripe.prices.list({ lookup_keys: ['seeded_monthly'], expand: ['data.product'] });
    expect((list.data[0]?.product as Stripe.Product | undefined)?.name).toBe('Seeded bench plan');
  });
});

describe('errors', () => {
  it('answers a missing object with 404 resource_missing, which the SDK raises as an invalid request', async () => {
    await expect(stripe.customers.retrieve('cus_doesnotexist')).rejects.toMatchObject({ type: 'StripeInvalidRequestError', statusCode: 404, code: 'resource_missing' });
  });

  it('refuses unknown parameters instead of ignoring them', async () => {
    await expect(stripe.customers.create({ email: 'a@b.test', tax_exempt: 'none' })).rejects.toMatchObject({ statusCode: 400, code: 'parameter_unknown', param: 'tax_exempt' });
  });

  it('refuses a missing required parameter with its bracketed name', async () => {
    const { price } = await planPrice();
    await expect(
      stripe.checkout.sessions.create({ mode: 'subscription', line_items: [{ price: price.id }], success_url: 'http://localhost:3000/ok', subscription_data: { trial_period_days: 'x' as unknown as number } }),
    ).rejects.toMatchObject({ statusCode: 400, param: 'subscription_data[trial_period_days]' });
  });

  it('refuses an expand path that names no expandable id', async () => {
    const { price } = await planPrice();
    await expect(stripe.prices.retrieve(price.id, { expand: ['currency'] })).rejects.toMatchObject({ statusCode: 400, param: 'expand' });
  });

  it('refuses requests without a secret key and refuses live keys', async () => {
    const res = await fetch(`${fake.url}/v1/customers/cus_x`);
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: { type: 'invalid_request_error', code: 'api_key_missing' } });
    await expect(sdkFor(fake.port, 'sk_live_notallowedhere').customers.create({})).rejects.toMatchObject({ type: 'StripeAuthenticationError', statusCode: 401 });
  });

  it('answers an endpoint it does not serve with a clear 404', async () => {
    await expect(stripe.coupons.list()).rejects.toMatchObject({ statusCode: 404, code: 'unrecognized_request_url' });
  });
});

describe('idempotency keys', () => {
  it('replays the same response for the same key and parameters', async () => {
    const first = await stripe.customers.create({ email: 'once@harbour-works.test' }, { idempotencyKey: 'create-once-1' });
    const again = await stripe.customers.create({ email: 'once@harbour-works.test' }, { idempotencyKey: 'create-once-1' });
    expect(again).toEqual(first);
    expect(fake.store.customers.size).toBe(1);
    const raw = await fetch(`${fake.url}/v1/customers`, {
      method: 'POST',
      headers: { Authorization: 'Bearer sk_test_local', 'Idempotency-Key': 'create-once-1', 'Content-Type': 'application/x-www-form-urlencoded' },
      body: 'email=once%40harbour-works.test',
    });
    expect(raw.headers.get('idempotent-replayed')).toBe('true');
    expect(((await raw.json()) as { id: string }).id).toBe(first.id);
  });

  it('refuses the same key with different parameters', async () => {
    await stripe.customers.create({ email: 'one@harbour-works.test' }, { idempotencyKey: 'key-2' });
    await expect(stripe.customers.create({ email: 'two@harbour-works.test' }, { idempotencyKey: 'key-2' })).rejects.toMatchObject({ type: 'StripeIdempotencyError', statusCode: 400 });
    expect(fake.store.customers.size).toBe(1);
  });

  it('does not keep refused requests, so the same key can be used once the parameters are fixed', async () => {
    await expect(stripe.customers.create({ email: 'not-an-email' }, { idempotencyKey: 'key-3' })).rejects.toMatchObject({ statusCode: 400 });
    const ok = await stripe.customers.create({ email: 'fixed@harbour-works.test' }, { idempotencyKey: 'key-3' });
    expect(ok.email).toBe('fixed@harbour-works.test');
  });
});

describe('reset', () => {
  it('forgets customers, prices and idempotency keys', async () => {
    const c = await stripe.customers.create({ email: 'gone@harbour-works.test' }, { idempotencyKey: 'reset-key' });
    await planPrice();
    const res = await control(fake.url, 'POST', '/reset');
    expect(res.status).toBe(200);
    await expect(stripe.customers.retrieve(c.id)).rejects.toMatchObject({ statusCode: 404 });
    expect((await stripe.prices.list({ lookup_keys: ['workshop_monthly'] })).data).toEqual([]);
    const fresh = await stripe.customers.create({ email: 'gone@harbour-works.test' }, { idempotencyKey: 'reset-key' });
    expect(fresh.id).not.toBe(c.id);
  });
});
