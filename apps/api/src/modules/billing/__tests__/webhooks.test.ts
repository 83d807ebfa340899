// Stripe webhooks: signature checks against the raw body, one processing per event id, and state
// taken from the subscription as Stripe has it now, whatever order the events arrive in.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf, openSecondInstance, seedShop, signedInAgent } from '../../../test-support/test-app';
import { ShopEntity } from '../../shops/shops.entity';
import { AuditEventEntity } from '../../audit/audit.entity';
import { BillingEventEntity, ShopBillingEntity } from '../billing.entity';
import { addPlan, payCheckout, putOnPlan, startBillingWorld, webhookSecret, type BillingWorld } from './billing-world';

let w: BillingWorld;
let shopId: string;
let subscriptionId: string;
beforeAll(async () => {
  w = await startBillingWorld();
  const plan = await addPlan(w.ctx);
  const shop = await seedShop(w.ctx, ['owner']);
  shopId = shop.shop.id;
  await putOnPlan(w.ctx, shopId, plan.id);
  const owner = await signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
  const started = await owner.post(`/api/shops/${shopId}/billing/checkout`).set(csrf).send({ planId: plan.id });
  await payCheckout(started.body.url);
  subscriptionId = (await w.ctx.db.reader.findOneByOrFail(ShopBillingEntity, { shopId })).stripeSubscriptionId!;
});
afterAll(() => w.close());

/** An event about our subscription whose payload claims `status` (the app must not believe it). */
function eventPayload(status: string, id = `evt_test_${randomUUID().replace(/-/g, '')}`) {
  return JSON.stringify({ id, object: 'event', type: 'customer.subscription.updated', created: Math.floor(Date.now() / 1000), data: { object: { id: subscriptionId, object: 'subscription', status } } });
}
const sign = (payload: string, options: { secret?: string; timestamp?: number } = {}) =>
  w.stripe.webhooks.generateTestHeaderString({ payload, secret: options.secret ?? webhookSecret, timestamp: options.timestamp });
const post = (payload: string, signature: string | null) => {
  const r = request(w.ctx.app).post('/api/billing/webhook').set('Content-Type', 'application/json');
  return (signature === null ? r : r.set('Stripe-Signature', signature)).send(payload);
};
const stateOf = async () => (await w.ctx.db.reader.findOneByOrFail(ShopEntity, { id: shopId })).billingState;
const counts = async () => ({ events: await w.ctx.db.reader.count(BillingEventEntity), audit: await w.ctx.db.reader.count(AuditEventEntity) });

describe('signature verification', () => {
  it('accepts a validly signed event (no CSRF header needed)', async () => {
    const payload = eventPayload('active');
    const res = await post(payload, sign(payload));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ received: true, duplicate: false });
    expect(await w.ctx.db.reader.existsBy(BillingEventEntity, { id: JSON.parse(payload).id })).toBe(true);
  });

  it.each([
    ['a tampered body', (p: string) => ({ body: p.replace('"active"', '"canceled"'), sig: sign(p) })],
    ['the wrong secret', (p: string) => ({ body: p, sig: sign(p, { secret: 'whsec_someone_else' }) })],
    ['a signature older than 5 minutes', (p: string) => ({ body: p, sig: sign(p, { timestamp: Math.floor(Date.now() / 1000) - 301 }) })],
    ['no signature', (p: string) => ({ body: p, sig: null })],
  ])('answers 400 and changes nothing for %s', async (_name, make) => {
    const before = await counts();
    const { body, sig } = make(eventPayload('active'));
    const res = await post(body, sig);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(await counts()).toEqual(before);
    expect(await stateOf()).toBe('active');
  });
});

describe('idempotency and order', () => {
  it('processes the same event once', async () => {
    const payload = eventPayload('active');
    const first = await post(payload, sign(payload));
    const before = await counts();
    const second = await post(payload, sign(payload));
    expect(first.body.duplicate).toBe(false);
    expect(second.status).toBe(200);
    expect(second.body.duplicate).toBe(true);
    expect(await counts()).toEqual(before);
  });

  it('processes an event once when Stripe delivers it to two app instances on one database', async () => {
    // Behind a load balancer a redelivery may reach another process: the seen ids are in the database.
    const other = await openSecondInstance(w.ctx);
    try {
      const payload = eventPayload('active');
      const first = await post(payload, sign(payload));
      const before = await counts();
      const again = await request(other.app).post('/api/billing/webhook').set('Content-Type', 'application/json').set('Stripe-Signature', sign(payload)).send(payload);
      expect(first.body.duplicate).toBe(false);
      expect(again.status).toBe(200);
      expect(again.body.duplicate).toBe(true);
      expect(await counts()).toEqual(before);
    } finally {
      await other.close();
    }
  });

  it('takes the state from Stripe, not from the event, so an old event arriving late changes nothing', async () => {
    // The subscription is cancelled in Stripe now; its own event is delivered by the fake.
    await w.stripe.subscriptions.cancel(subscriptionId);
    for (let i = 0; i < 100 && (await stateOf()) !== 'cancelled'; i++) await new Promise((r) => setTimeout(r, 30));
    expect(await stateOf()).toBe('cancelled');
    // An earlier "it is active" event turns up afterwards: re-reading the subscription keeps it cancelled.
    const late = eventPayload('active');
    const res = await post(late, sign(late));
    expect(res.status).toBe(200);
    expect(await stateOf()).toBe('cancelled');
    // Events resent by Stripe (same id) are recognised as seen.
    const events = await request(w.fake.url).get('/_test/events?type=customer.subscription.created');
    const created = (events.body.data as Array<{ event: { id: string } }>)[0]!.event.id;
    await request(w.fake.url).post(`/_test/resend/${created}`);
    expect(await stateOf()).toBe('cancelled');
  });
});
