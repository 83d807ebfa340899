import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createShopWithUsers } from '../../test-support/test-support.service';
import { AuditEventEntity } from '../../audit/audit.entity';
import { SessionEntity } from '../../auth/auth.entity';
import { ShopEntity } from '../shops.entity';
import { insertMembership } from '../shops.service';

let ctx: TestContext;
let harbour: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
beforeAll(async () => {
  ctx = await createTestContext();
  harbour = await seedShop(ctx);
  other = await seedShop(ctx, ['owner']);
});
afterAll(() => ctx.close());

const as = (role: 'owner' | 'mechanic' | 'buyer' | 'viewer', s = harbour) => signedInAgent(ctx.app, s.byRole[role].email, s.password);

describe('GET /api/shops', () => {
  it('lists my shops with my role', async () => {
    const agent = await as('buyer');
    const res = await agent.get('/api/shops');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ shops: [{ id: harbour.shop.id, name: harbour.shop.name, role: 'buyer' }] });
  });

  it('answers 401 when signed out', async () => {
    expect((await request(ctx.app).get('/api/shops')).status).toBe(401);
    expect((await request(ctx.app).get(`/api/shops/${harbour.shop.id}`)).status).toBe(401);
  });
});

describe('GET /api/shops/:shopId', () => {
  it('shows a shop to its members', async () => {
    const res = await (await as('viewer')).get(`/api/shops/${harbour.shop.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: harbour.shop.id, name: harbour.shop.name, slug: harbour.shop.slug, createdAt: expect.any(String) });
  });

  it("answers 404 for another shop's id", async () => {
    const res = await (await as('owner')).get(`/api/shops/${other.shop.id}`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('answers 404 for a malformed or unknown id', async () => {
    const agent = await as('owner');
    expect((await agent.get('/api/shops/not-a-uuid')).status).toBe(404);
    expect((await agent.get('/api/shops/00000000-0000-4000-8000-000000000000')).status).toBe(404);
  });

  it('answers 404 to a platform admin who is not a member', async () => {
    const admin = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
    const agent = await signedInAgent(ctx.app, admin.users[0]!.email, admin.password);
    expect((await agent.get(`/api/shops/${harbour.shop.id}`)).status).toBe(404);
  });
});

describe('PATCH /api/shops/:shopId', () => {
  it('lets the owner rename the shop, and audits the change', async () => {
    const res = await (await as('owner')).patch(`/api/shops/${harbour.shop.id}`).set(csrf).send({ name: '  Harbour Works Renamed  ' });
    expect(res.status).toBe(200);
    expect(res.body.name).toBe('Harbour Works Renamed');
    const row = await ctx.db.reader.findOneByOrFail(ShopEntity, { id: harbour.shop.id });
    expect(row.name).toBe('Harbour Works Renamed');
    const audit = await ctx.db.reader.find(AuditEventEntity, { where: { action: 'shop.updated', shopId: harbour.shop.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.actorUserId).toBe(harbour.byRole.owner.id);
    expect(audit[0]!.changes).toEqual({ name: { before: harbour.shop.name, after: 'Harbour Works Renamed' } });
  });

  it.each(['mechanic', 'buyer', 'viewer'] as const)('refuses a %s with 403 and changes nothing', async (role) => {
    const before = await ctx.db.reader.findOneByOrFail(ShopEntity, { id: harbour.shop.id });
    const res = await (await as(role)).patch(`/api/shops/${harbour.shop.id}`).set(csrf).send({ name: 'Taken Over' });
    expect(res.status).toBe(403);
    expect(res.body.error).toEqual({ code: 'forbidden', message: 'Your role in this shop does not allow you to update this shop.' });
    expect((await ctx.db.reader.findOneByOrFail(ShopEntity, { id: harbour.shop.id })).name).toBe(before.name);
  });

  it("answers 404 to an owner for another shop's id and changes nothing", async () => {
    const res = await (await as('owner')).patch(`/api/shops/${other.shop.id}`).set(csrf).send({ name: 'Taken Over' });
    expect(res.status).toBe(404);
    expect((await ctx.db.reader.findOneByOrFail(ShopEntity, { id: other.shop.id })).name).toBe(other.shop.name);
  });

  it('refuses unknown fields', async () => {
    const res = await (await as('owner')).patch(`/api/shops/${harbour.shop.id}`).set(csrf).send({ name: 'Fine Name', billingState: 'active' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect((await ctx.db.reader.findOneByOrFail(ShopEntity, { id: harbour.shop.id })).billingState).toBe('trial');
  });

  it('refuses changes while the shop is suspended, with the reason', async () => {
    const s = await seedShop(ctx, ['owner']);
    await ctx.db.write((m) => m.update(ShopEntity, { id: s.shop.id }, { billingState: 'suspended' }));
    const agent = await as('owner', s);
    expect((await agent.get(`/api/shops/${s.shop.id}`)).status).toBe(200);
    const res = await agent.patch(`/api/shops/${s.shop.id}`).set(csrf).send({ name: 'Still Mine' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/read-only/);
  });
});

describe('POST /api/me/active-shop', () => {
  it('switches between shops I belong to', async () => {
    // The other shop's owner also works as a viewer at harbour.
    await ctx.db.write((m) => insertMembership(m, { shopId: harbour.shop.id, userId: other.byRole.owner.id, role: 'viewer', at: ctx.clock.now(), actor: { userId: null } }));
    const agent = await as('owner', other);
    const me = await agent.get('/api/me');
    expect(me.body.memberships.map((m: { role: string }) => m.role).sort()).toEqual(['owner', 'viewer']);
    const res = await agent.post('/api/me/active-shop').set(csrf).send({ shopId: harbour.shop.id });
    expect(res.status).toBe(200);
    expect(res.body.activeShopId).toBe(harbour.shop.id);
    expect((await agent.get('/api/me')).body.activeShopId).toBe(harbour.shop.id);
  });

  it("answers 404 for a shop I am not in and changes nothing", async () => {
    const agent = await as('mechanic');
    const before = await agent.get('/api/me');
    const sessionsBefore = await ctx.db.reader.find(SessionEntity, { where: { userId: harbour.byRole.mechanic.id } });
    const res = await agent.post('/api/me/active-shop').set(csrf).send({ shopId: other.shop.id });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect((await agent.get('/api/me')).body.activeShopId).toBe(before.body.activeShopId);
    expect(await ctx.db.reader.find(SessionEntity, { where: { userId: harbour.byRole.mechanic.id } })).toEqual(sessionsBefore);
  });

  it('refuses unknown fields and malformed ids', async () => {
    const agent = await as('mechanic');
    expect((await agent.post('/api/me/active-shop').set(csrf).send({ shopId: harbour.shop.id, role: 'owner' })).status).toBe(400);
    expect((await agent.post('/api/me/active-shop').set(csrf).send({ shopId: 'harbour' })).status).toBe(400);
  });
});

describe('tenant keys in the database', () => {
  it('refuses a session whose active shop is one its user is not a member of', async () => {
    const session = await ctx.db.reader.findOneByOrFail(SessionEntity, { userId: harbour.byRole.mechanic.id });
    await expect(ctx.db.write((m) => m.update(SessionEntity, { id: session.id }, { activeShopId: other.shop.id }))).rejects.toThrow(/foreign key/i);
  });

  it('refuses to change or delete audit events', async () => {
    await expect(ctx.db.write((m) => m.query(`UPDATE audit_events SET action = 'x'`))).rejects.toThrow(/append-only/);
    await expect(ctx.db.write((m) => m.query(`DELETE FROM audit_events`))).rejects.toThrow(/append-only/);
  });
});
