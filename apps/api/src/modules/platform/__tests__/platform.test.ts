// The platform console: platform admins only; shops with plan, state and usage; onboarding with
// the owner's invitation; suspension by hand (read-only, with its reason) and reactivation; plans.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createShopWithUsers } from '../../test-support/test-support.service';
import { AuditEventEntity } from '../../audit/audit.entity';
import { addPlan, putOnPlan } from '../../billing/__tests__/billing-world';
import type { BillingService } from '../../billing/billing.service';
import { ShopEntity } from '../../shops/shops.entity';
import type { StaffService } from '../../staff/staff.service';
import { createPlatformService } from '../platform.service';

let ctx: TestContext;
let admin: Awaited<ReturnType<typeof signedInAgent>>;
beforeAll(async () => {
  ctx = await createTestContext();
  const created = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
  admin = await signedInAgent(ctx.app, created.users[0]!.email, created.password);
});
afterAll(() => ctx.close());

describe('access', () => {
  it('refuses shop users (403) and anonymous callers (401) on every platform route', async () => {
    const shop = await seedShop(ctx, ['owner']);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    for (const call of [
      (a: typeof owner) => a.get('/api/platform/shops'),
      (a: typeof owner) => a.get('/api/platform/plans'),
      (a: typeof owner) => a.post('/api/platform/shops').set(csrf).send({ name: 'Nope', planId: shop.shop.id, ownerEmail: 'x@nope.test' }),
      (a: typeof owner) => a.post(`/api/platform/shops/${shop.shop.id}/suspend`).set(csrf).send({ reason: 'nope' }),
    ]) {
      const res = await call(owner);
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('Only platform admins may use the platform console.');
    }
    expect((await request(ctx.app).get('/api/platform/shops')).status).toBe(401);
  });
});

describe('shops', () => {
  it('lists plan, state, seats used, catalogue size and last activity; searches and filters', async () => {
    const plan = await addPlan(ctx, { seatLimit: 5, catalogueLimit: 100 });
    const shop = await seedShop(ctx, ['owner', 'mechanic'], );
    await putOnPlan(ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    await owner.post(`/api/shops/${shop.shop.id}/parts`).set(csrf).send({ number: 'PL-1', description: 'Platform part' }).expect(201);
    const res = await admin.get(`/api/platform/shops?q=${encodeURIComponent(shop.shop.name.toUpperCase())}`);
    expect(res.status).toBe(200);
    expect(res.body.shops).toHaveLength(1);
    expect(res.body.shops[0]).toMatchObject({ id: shop.shop.id, plan: { id: plan.id, name: plan.name }, billingState: 'trial', seatsUsed: 2, seatLimit: 5, catalogueSize: 1, catalogueLimit: 100 });
    expect(res.body.shops[0].lastActivityAt).toBe(ctx.clock.now().toISOString());
    const byPlan = await admin.get(`/api/platform/shops?planId=${plan.id}`);
    expect(byPlan.body.shops.map((s: { id: string }) => s.id)).toEqual([shop.shop.id]);
    const suspended = await admin.get('/api/platform/shops?state=suspended');
    expect(suspended.body.shops.map((s: { id: string }) => s.id)).not.toContain(shop.shop.id);
    expect((await admin.get('/api/platform/shops?state=sleeping')).status).toBe(400);
  });

  it('onboards a shop on a plan and invites its owner, who accepts and runs the shop', async () => {
    const plan = await addPlan(ctx);
    const res = await admin.post('/api/platform/shops').set(csrf).send({ name: 'Saltmarsh Motors', planId: plan.id, ownerEmail: 'Rhoda@Saltmarsh-Motors.test' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Saltmarsh Motors', plan: { id: plan.id }, billingState: 'trial', seatsUsed: 1 });
    const mail = ctx.mailer.outbox.find((m) => m.to === 'rhoda@saltmarsh-motors.test');
    expect(mail?.subject).toBe('You are invited to Saltmarsh Motors on Tappet');
    const token = /accept-invitation\?token=([A-Za-z0-9_-]+)/.exec(mail!.text)![1]!;
    const person = request.agent(ctx.app);
    const accepted = await person.post('/api/invitations/accept').set(csrf).send({ token, name: 'Rhoda Veck', password: 'tidal brass gearbox' });
    expect(accepted.status).toBe(200);
    const staff = await person.get(`/api/shops/${res.body.id}/staff`);
    expect(staff.status).toBe(200);
    expect(staff.body.members[0]).toMatchObject({ email: 'rhoda@saltmarsh-motors.test', role: 'owner' });
    const audited = await ctx.db.reader.find(AuditEventEntity, { where: { shopId: res.body.id } });
    expect(audited.map((e) => e.action)).toEqual(expect.arrayContaining(['shop.created', 'invitation.created']));
  });

  it('refuses onboarding onto an unknown plan, with nothing created', async () => {
    const before = (await admin.get('/api/platform/shops')).body.shops.length;
    const res = await admin.post('/api/platform/shops').set(csrf).send({ name: 'Nowhere Cycles', planId: '00000000-0000-4000-8000-000000000000', ownerEmail: 'a@nowhere.test' });
    expect(res.status).toBe(404);
    expect((await admin.get('/api/platform/shops')).body.shops.length).toBe(before);
  });

  it('creates no shop when its owner’s invitation fails: the shop and the invitation are one write', async () => {
    // Nothing refuses a new shop's first invitation in practice (a plan has at least one seat), so
    // the failure is staged: any error while inviting must take the new shop back with it.
    const plan = await addPlan(ctx);
    const failing = { inviteWithin: () => Promise.reject(new Error('invitation refused')) } as unknown as StaffService;
    const platform = createPlatformService({ db: ctx.db, clock: ctx.clock, billing: {} as BillingService, staff: failing });
    const before = await ctx.db.reader.count(ShopEntity);
    await expect(platform.onboard({ name: 'Seatless Cycles', planId: plan.id, ownerEmail: 'owner@seatless-cycles.test' }, { userId: null, name: null })).rejects.toThrow('invitation refused');
    expect(await ctx.db.reader.count(ShopEntity)).toBe(before);
    expect((await admin.get('/api/platform/shops?q=seatless')).body.shops).toEqual([]);
  });

  it('suspends a shop by hand (read-only, naming the reason, audited) and reactivates it', async () => {
    const shop = await seedShop(ctx, ['owner']);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const suspended = await admin.post(`/api/platform/shops/${shop.shop.id}/suspend`).set(csrf).send({ reason: 'Chargeback under review' });
    expect(suspended.body).toEqual({ billingState: 'suspended' });
    const refused = await owner.patch(`/api/shops/${shop.shop.id}`).set(csrf).send({ name: 'Renamed While Suspended' });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toContain('Tappet suspended it (Chargeback under review)');
    expect((await owner.get(`/api/shops/${shop.shop.id}`)).status).toBe(200);
    expect((await admin.post(`/api/platform/shops/${shop.shop.id}/suspend`).set(csrf).send({ reason: 'Again' })).status).toBe(409);

    const back = await admin.post(`/api/platform/shops/${shop.shop.id}/reactivate`).set(csrf).send({ reason: 'Chargeback withdrawn' });
    expect(back.body).toEqual({ billingState: 'trial' });
    expect((await owner.patch(`/api/shops/${shop.shop.id}`).set(csrf).send({ name: 'Renamed After' })).status).toBe(200);
    const actions = (await ctx.db.reader.find(AuditEventEntity, { where: { shopId: shop.shop.id }, order: { createdAt: 'ASC' } })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['shop.suspended', 'shop.reactivated', 'billing.state_changed']));
    expect((await admin.post(`/api/platform/shops/${shop.shop.id}/reactivate`).set(csrf).send({ reason: 'Nothing to lift' })).status).toBe(409);
    expect((await admin.post('/api/platform/shops/00000000-0000-4000-8000-000000000000/suspend').set(csrf).send({ reason: 'Who?' })).status).toBe(404);
  });
});

describe('plans', () => {
  it('creates, changes and retires plans, refusing duplicates', async () => {
    const created = await admin.post('/api/platform/plans').set(csrf).send({ name: 'Coachhouse', monthlyPriceMinor: 7900, currency: 'GBP', stripeLookupKey: 'tappet_coachhouse_test', seatLimit: 10, catalogueLimit: null, vehicleLimit: 40 });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Coachhouse', currency: 'gbp', isActive: true });
    expect((await admin.post('/api/platform/plans').set(csrf).send({ name: 'Coachhouse', monthlyPriceMinor: 1, currency: 'gbp', stripeLookupKey: 'other_key', seatLimit: 1, catalogueLimit: 1, vehicleLimit: 1 })).status).toBe(409);
    const bad = await admin.post('/api/platform/plans').set(csrf).send({ name: 'X', monthlyPriceMinor: -1, currency: 'pounds', stripeLookupKey: 'A B', seatLimit: 0, catalogueLimit: null, vehicleLimit: null });
    expect(bad.status).toBe(400);
    const changed = await admin.patch(`/api/platform/plans/${created.body.id}`).set(csrf).send({ monthlyPriceMinor: 8900, isActive: false });
    expect(changed.body).toMatchObject({ monthlyPriceMinor: 8900, isActive: false });
    const list = await admin.get('/api/platform/plans');
    expect(list.body.plans.find((p: { id: string }) => p.id === created.body.id)).toMatchObject({ isActive: false });
    const audit = await ctx.db.reader.find(AuditEventEntity, { where: { entityId: created.body.id } });
    expect(audit.map((e) => e.action).sort()).toEqual(['plan.created', 'plan.updated']);
  });
});
