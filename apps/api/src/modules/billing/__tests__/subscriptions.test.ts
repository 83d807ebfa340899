// Subscriptions end to end through the real SDK and the fake Stripe API: checkout, failed
// payments, the grace period, unpaid and cancelled subscriptions, and what each does to writes.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf, seedShop, signedInAgent } from '../../../test-support/test-app';
import { ShopBillingEntity } from '../billing.entity';
import { ShopEntity } from '../../shops/shops.entity';
import { AuditEventEntity } from '../../audit/audit.entity';
import { addPlan, payCheckout, putOnPlan, startBillingWorld, type BillingWorld } from './billing-world';

const day = 24 * 3600_000;
let w: BillingWorld;
beforeAll(async () => {
  w = await startBillingWorld();
});
afterAll(() => w.close());

async function subscribedShop() {
  const plan = await addPlan(w.ctx);
  const shop = await seedShop(w.ctx, ['owner', 'buyer']);
  await putOnPlan(w.ctx, shop.shop.id, plan.id);
  const owner = await signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
  const buyer = await signedInAgent(w.ctx.app, shop.byRole.buyer.email, shop.password);
  const started = await owner.post(`/api/shops/${shop.shop.id}/billing/checkout`).set(csrf).send({ planId: plan.id });
  expect(started.status, JSON.stringify(started.body)).toBe(200);
  const paid = await payCheckout(started.body.url);
  expect(paid.status).toBe(303);
  expect(paid.headers.get('location')).toBe(`http://tappet.test/shops/${shop.shop.id}/billing?checkout=done`);
  const record = await w.ctx.db.reader.findOneByOrFail(ShopBillingEntity, { shopId: shop.shop.id });
  return { shop, plan, owner, buyer, record, shopId: shop.shop.id };
}

const stateOf = async (shopId: string) => (await w.ctx.db.reader.findOneByOrFail(ShopEntity, { id: shopId })).billingState;
/** Waits for a webhook sent after an SDK call (API calls answer before their events are delivered). */
async function waitForState(shopId: string, state: string) {
  for (let i = 0; i < 100 && (await stateOf(shopId)) !== state; i++) await new Promise((r) => setTimeout(r, 30));
  return stateOf(shopId);
}
const newPart = (agent: Awaited<ReturnType<typeof signedInAgent>>, shopId: string) =>
  agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: `SB-${Math.floor(Math.random() * 1e9)}`, description: 'Billing test part' });

describe('checkout', () => {
  it('starts on a trial, then becomes active once Stripe says the checkout was paid', async () => {
    const plan = await addPlan(w.ctx);
    const shop = await seedShop(w.ctx, ['owner']);
    await putOnPlan(w.ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
    const before = await owner.get(`/api/shops/${shop.shop.id}/billing`);
    expect(before.body.status).toMatchObject({ state: 'trial', trialDaysLeft: 14, readOnly: false });
    expect(before.body.plan.name).toBe(plan.name);
    expect(before.body.subscription.canOpenPortal).toBe(false);

    const started = await owner.post(`/api/shops/${shop.shop.id}/billing/checkout`).set(csrf).send({ planId: plan.id });
    expect(started.body.url).toMatch(new RegExp(`^${w.fake.url}/checkout/cs_`));
    // The price was created in Stripe under the plan's lookup key.
    const prices = await w.stripe.prices.list({ lookup_keys: [plan.stripeLookupKey] });
    expect(prices.data[0]?.unit_amount).toBe(2900);
    expect(await stateOf(shop.shop.id)).toBe('trial');

    await payCheckout(started.body.url);
    expect(await stateOf(shop.shop.id)).toBe('active');
    const after = await owner.get(`/api/shops/${shop.shop.id}/billing`);
    expect(after.body.status.state).toBe('active');
    expect(after.body.subscription.canOpenPortal).toBe(true);
    const portal = await owner.post(`/api/shops/${shop.shop.id}/billing/portal`).set(csrf);
    expect(portal.body.url).toMatch(new RegExp(`^${w.fake.url}/portal/`));
    // A second checkout is refused: plan changes go through the portal.
    const again = await owner.post(`/api/shops/${shop.shop.id}/billing/checkout`).set(csrf).send({ planId: plan.id });
    expect(again.status).toBe(409);
  });

  it('makes one Stripe customer for a shop when two checkouts start at once (a double click)', async () => {
    const plan = await addPlan(w.ctx);
    const shop = await seedShop(w.ctx, ['owner']);
    await putOnPlan(w.ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
    const both = await Promise.all([1, 2].map(() => owner.post(`/api/shops/${shop.shop.id}/billing/checkout`).set(csrf).send({ planId: plan.id })));
    expect(both.some((r) => r.status === 200), JSON.stringify(both.map((r) => r.body))).toBe(true);
    const customers = [...w.fake.store.customers.values()].filter((c) => c.metadata['shopId'] === shop.shop.id);
    expect(customers).toHaveLength(1);
    const record = await w.ctx.db.reader.findOneByOrFail(ShopBillingEntity, { shopId: shop.shop.id });
    expect(record.stripeCustomerId).toBe(customers[0]!.id);
  });

  it('refuses an unknown plan and non-owners', async () => {
    const { shopId, owner, buyer, plan } = await subscribedShop();
    expect((await owner.post(`/api/shops/${shopId}/billing/checkout`).set(csrf).send({ planId: '00000000-0000-4000-8000-000000000000' })).status).toBe(404);
    expect((await buyer.post(`/api/shops/${shopId}/billing/checkout`).set(csrf).send({ planId: plan.id })).status).toBe(403);
    expect((await buyer.get(`/api/shops/${shopId}/billing`)).status).toBe(403);
    // Every member sees the state, for the banner.
    expect((await buyer.get(`/api/shops/${shopId}/billing/status`)).body.state).toBe('active');
  });
});

describe('payment trouble', () => {
  it('a failed renewal makes the shop past due (writes still work); 14 days unpaid suspends it read-only; paying restores writing at once', async () => {
    const world = await subscribedShop();
    const { shopId, record, shop } = world;
    let { buyer } = world;
    await request(w.fake.url).post('/_test/fail-next-payment').send({ customer: record.stripeCustomerId });
    const advanced = await request(w.fake.url).post(`/_test/subscriptions/${record.stripeSubscriptionId}/advance`).send({ to: 'renewal' });
    expect(advanced.status).toBe(200);
    expect(await stateOf(shopId)).toBe('past_due');
    const status = await buyer.get(`/api/shops/${shopId}/billing/status`);
    expect(status.body).toMatchObject({ state: 'past_due', readOnly: false });
    expect(status.body.suspendsAt).not.toBeNull();
    expect((await newPart(buyer, shopId)).status).toBe(201);

    w.ctx.clock.advance(13 * day);
    // Sessions time out meanwhile: sign in again, as people would.
    buyer = await signedInAgent(w.ctx.app, shop.byRole.buyer.email, shop.password);
    expect((await newPart(buyer, shopId)).status).toBe(201);
    w.ctx.clock.advance(1 * day + 1000);
    buyer = await signedInAgent(w.ctx.app, shop.byRole.buyer.email, shop.password);
    const owner = await signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
    const refused = await newPart(buyer, shopId);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/read-only.*more than 14 days overdue/);
    expect(refused.body.error.details).toEqual({ reason: 'shop_read_only', billingState: 'suspended' });
    expect(await stateOf(shopId)).toBe('suspended');
    // /api/me tells the web app, which hides the controls that would be refused.
    const membershipOf = async () => ((await buyer.get('/api/me')).body.memberships as Array<{ shopId: string; readOnly: boolean }>).find((m) => m.shopId === shopId);
    expect(await membershipOf()).toMatchObject({ readOnly: true });
    // Reads and the export keep working; the owner can still reach billing to pay.
    expect((await buyer.get(`/api/shops/${shopId}/parts`)).status).toBe(200);
    expect((await owner.get(`/api/shops/${shopId}/export.zip`)).status).toBe(200);
    expect((await owner.post(`/api/shops/${shopId}/billing/portal`).set(csrf)).status).toBe(200);

    const invoice = advanced.body.invoice as { id: string };
    expect((await request(w.fake.url).post(`/_test/invoices/${invoice.id}/pay`).send({})).status).toBe(200);
    expect(await stateOf(shopId)).toBe('active');
    expect((await newPart(buyer, shopId)).status).toBe(201);
    expect(await membershipOf()).toMatchObject({ readOnly: false });
    w.ctx.clock.advance(-14 * day - 1000);
  });

  it('Stripe unpaid suspends at once; a cancelled subscription is read-only too, and nothing is deleted', async () => {
    const { shopId, buyer, record } = await subscribedShop();
    const made = await newPart(buyer, shopId);
    await request(w.fake.url).post(`/_test/subscriptions/${record.stripeSubscriptionId}/advance`).send({ to: 'unpaid' });
    expect(await stateOf(shopId)).toBe('suspended');
    const refused = await newPart(buyer, shopId);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/invoices stayed unpaid/);

    await w.stripe.subscriptions.cancel(record.stripeSubscriptionId!);
    expect(await waitForState(shopId, 'cancelled')).toBe('cancelled');
    const cancelled = await buyer.patch(`/api/shops/${shopId}/parts/${made.body.id}`).set(csrf).send({ notes: 'x' });
    expect(cancelled.status).toBe(403);
    expect(cancelled.body.error.message).toMatch(/cancelled/);
    expect((await buyer.get(`/api/shops/${shopId}/parts/${made.body.id}`)).status).toBe(200);
  });

  it('a cancelled shop that subscribes again writes at once', async () => {
    const { shopId, owner, buyer, record, plan } = await subscribedShop();
    await w.stripe.subscriptions.cancel(record.stripeSubscriptionId!);
    expect(await waitForState(shopId, 'cancelled')).toBe('cancelled');
    const started = await owner.post(`/api/shops/${shopId}/billing/checkout`).set(csrf).send({ planId: plan.id });
    expect(started.status).toBe(200);
    await payCheckout(started.body.url);
    expect(await stateOf(shopId)).toBe('active');
    expect((await newPart(buyer, shopId)).status).toBe(201);
  });
});

describe('trial without a card', () => {
  it('becomes past due when the trial ends, and read-only 14 days later; every change is audited', async () => {
    const shop = await seedShop(w.ctx, ['owner']);
    const shopId = shop.shop.id;
    const owner = () => signedInAgent(w.ctx.app, shop.byRole.owner.email, shop.password);
    w.ctx.clock.advance(14 * day - 1000);
    expect((await (await owner()).get(`/api/shops/${shopId}/billing/status`)).body).toMatchObject({ state: 'trial', trialDaysLeft: 1 });
    w.ctx.clock.advance(2000);
    expect((await (await owner()).get(`/api/shops/${shopId}/billing/status`)).body).toMatchObject({ state: 'past_due', readOnly: false });
    expect((await newPart(await owner(), shopId)).status).toBe(201);
    w.ctx.clock.advance(14 * day);
    const agent = await owner();
    const refused = await newPart(agent, shopId);
    expect(refused.status).toBe(403);
    expect((await agent.get(`/api/shops/${shopId}/billing/status`)).body).toMatchObject({ state: 'suspended', readOnly: true });
    const changes = await w.ctx.db.reader.find(AuditEventEntity, { where: { shopId, action: 'billing.state_changed' }, order: { createdAt: 'ASC' } });
    expect(changes.map((e) => e.changes['billingState']?.after)).toEqual(['past_due', 'suspended']);
    w.ctx.clock.advance(-28 * day - 1000);
  });
});
