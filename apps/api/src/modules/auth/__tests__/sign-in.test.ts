import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { meResponseSchema } from '@tappet/contracts';
import { AuditEventEntity } from '../../audit/audit.entity';
import { UserEntity } from '../../users/users.entity';
import { SessionEntity } from '../auth.entity';
import { createTestContext, csrf, seedShop, sessionTokenFrom, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
beforeAll(async () => {
  ctx = await createTestContext();
  shop = await seedShop(ctx);
});
afterAll(() => ctx.close());

const signIn = (email: string, password: string) => request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email, password });

describe('POST /api/auth/sign-in', () => {
  it('signs in, sets the session cookie and returns the me payload', async () => {
    const owner = shop.byRole.owner;
    const res = await signIn(owner.email.toUpperCase(), shop.password);
    expect(res.status).toBe(200);
    expect(meResponseSchema.parse(res.body)).toBeTruthy();
    expect(res.body.user).toEqual({ id: owner.id, email: owner.email, name: owner.name, isPlatformAdmin: false });
    expect(res.body.memberships).toEqual([{ shopId: shop.shop.id, shopName: shop.shop.name, role: 'owner', spendingLimitMinor: null, readOnly: false }]);
    expect(res.body.activeShopId).toBe(shop.shop.id);
    expect(sessionTokenFrom(res)).toMatch(/^[\w-]{43}$/);
  });

  it('sets an httpOnly, SameSite=Lax cookie on path / without Secure over http', async () => {
    const res = await signIn(shop.byRole.viewer.email, shop.password);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('tappet_session='));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/; HttpOnly/i);
    expect(cookie).toMatch(/; SameSite=Lax/i);
    expect(cookie).toMatch(/; Path=\//i);
    expect(cookie).not.toMatch(/; Secure/i);
  });

  it('stores only the SHA-256 of the token', async () => {
    const res = await signIn(shop.byRole.buyer.email, shop.password);
    const token = sessionTokenFrom(res)!;
    const sessions = await ctx.db.reader.find(SessionEntity, { where: { userId: shop.byRole.buyer.id } });
    expect(sessions.length).toBeGreaterThan(0);
    for (const s of sessions) {
      expect(s.id).toMatch(/^[0-9a-f]{64}$/);
      expect(s.id).not.toContain(token);
    }
  });

  it('issues a new token at every sign-in and ends the session the browser came with', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
    const first = await ctx.db.reader.count(SessionEntity, { where: { userId: shop.byRole.mechanic.id } });
    const again = await agent.post('/api/auth/sign-in').set(csrf).send({ email: shop.byRole.mechanic.email, password: shop.password });
    const second = await agent.post('/api/auth/sign-in').set(csrf).send({ email: shop.byRole.mechanic.email, password: shop.password });
    expect(sessionTokenFrom(again)).not.toEqual(sessionTokenFrom(second));
    expect(await ctx.db.reader.count(SessionEntity, { where: { userId: shop.byRole.mechanic.id } })).toBe(first);
    expect((await agent.get('/api/me')).status).toBe(200);
  });

  it('refuses a wrong password with 401 and no cookie', async () => {
    const res = await signIn(shop.byRole.owner.email, 'not-the-password');
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'unauthenticated', message: 'The e-mail address or password is not right.' });
    expect(sessionTokenFrom(res)).toBeNull();
  });

  it('answers an unknown e-mail exactly like a wrong password', async () => {
    const unknown = await signIn('nobody@nowhere.test', 'not-the-password');
    const wrong = await signIn(shop.byRole.owner.email, 'not-the-password');
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
  });

  it('refuses a deactivated user even with the right password', async () => {
    const extra = await seedShop(ctx, ['viewer']);
    await ctx.db.write((m) => m.update(UserEntity, { id: extra.byRole.viewer.id }, { isActive: false }));
    const res = await signIn(extra.byRole.viewer.email, extra.password);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(sessionTokenFrom(res)).toBeNull();
  });

  it('records sign-ins in the audit log', async () => {
    const events = await ctx.db.reader.find(AuditEventEntity, { where: { action: 'auth.signed_in', actorUserId: shop.byRole.owner.id } });
    expect(events.length).toBeGreaterThan(0);
    expect(events[0]!.entityId).toBe(shop.byRole.owner.id);
  });
});

describe('GET /api/me and sign-out', () => {
  it('answers 401 when signed out', async () => {
    const res = await request(ctx.app).get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('answers 401 for a made-up cookie and clears it', async () => {
    const res = await request(ctx.app).get('/api/me').set('Cookie', 'tappet_session=made-up-token');
    expect(res.status).toBe(401);
    expect(String(res.headers['set-cookie'])).toMatch(/tappet_session=;/);
  });

  it('returns the signed-in person', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
    const res = await agent.get('/api/me');
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(shop.byRole.buyer.email);
    expect(res.body.memberships).toEqual([{ shopId: shop.shop.id, shopName: shop.shop.name, role: 'buyer', spendingLimitMinor: 50_000, readOnly: false }]);
  });

  it('ends the session at sign-out; the old cookie stops working', async () => {
    const token = sessionTokenFrom(await signIn(shop.byRole.viewer.email, shop.password))!;
    const cookie = `tappet_session=${token}`;
    expect((await request(ctx.app).get('/api/me').set('Cookie', cookie)).status).toBe(200);
    const out = await request(ctx.app).post('/api/auth/sign-out').set(csrf).set('Cookie', cookie);
    expect(out.status).toBe(200);
    expect(String(out.headers['set-cookie'])).toMatch(/tappet_session=;/);
    // Replaying the old cookie does not bring the session back.
    expect((await request(ctx.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
  });
});
