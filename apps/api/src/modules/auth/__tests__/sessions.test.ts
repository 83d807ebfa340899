import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, sessionTokenFrom, type TestContext } from '../../../test-support/test-app';
import { createAuthService } from '../auth.service';
import { createMemoryMailer } from '../../../lib/mailer';
import { SessionEntity } from '../auth.entity';

const minute = 60_000;
let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
beforeAll(async () => {
  // Short time-outs so the fake clock can step over them.
  ctx = await createTestContext({ env: { SESSION_IDLE_TIMEOUT_MINUTES: '30', SESSION_ABSOLUTE_TIMEOUT_MINUTES: '120' } });
  shop = await seedShop(ctx, ['owner']);
});
afterAll(() => ctx.close());

async function newSessionCookie(): Promise<string> {
  const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email: shop.byRole.owner.email, password: shop.password });
  return `tappet_session=${sessionTokenFrom(res)!}`;
}
const me = (cookie: string) => request(ctx.app).get('/api/me').set('Cookie', cookie);

describe('session time-outs', () => {
  it('ends a session left idle longer than the idle time-out', async () => {
    const cookie = await newSessionCookie();
    ctx.clock.advance(29 * minute);
    expect((await me(cookie)).status).toBe(200);
    ctx.clock.advance(31 * minute);
    expect((await me(cookie)).status).toBe(401);
    // Gone for good, not just asleep.
    ctx.clock.advance(-60 * minute);
    expect((await me(cookie)).status).toBe(401);
    ctx.clock.advance(60 * minute);
  });

  it('keeps an active session alive up to the absolute time-out, then ends it', async () => {
    const cookie = await newSessionCookie();
    for (let elapsed = 0; elapsed < 115; elapsed += 20) {
      expect((await me(cookie)).status).toBe(200);
      ctx.clock.advance(20 * minute);
    }
    // 120 minutes after sign-in, however active.
    expect((await me(cookie)).status).toBe(401);
  });

  it('clears out ended sessions of everyone at the next sign-in', async () => {
    await newSessionCookie();
    const stale = await ctx.db.reader.count(SessionEntity, { where: { userId: shop.byRole.owner.id } });
    expect(stale).toBeGreaterThan(0);
    ctx.clock.advance(31 * minute);
    const someoneElse = await seedShop(ctx, ['viewer']);
    await request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email: someoneElse.byRole.viewer.email, password: someoneElse.password });
    expect(await ctx.db.reader.count(SessionEntity, { where: { userId: shop.byRole.owner.id } })).toBe(0);
  });

  it('puts the absolute time-out into the cookie lifetime', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email: shop.byRole.owner.email, password: shop.password });
    expect(String(res.headers['set-cookie'])).toMatch(/Max-Age=7200/);
  });

  it('ends every session of a user who is deactivated', async () => {
    const cookieA = await newSessionCookie();
    const cookieB = await newSessionCookie();
    const auth = createAuthService({ db: ctx.db, env: ctx.env, clock: ctx.clock, mailer: createMemoryMailer() });
    await auth.deactivateUser(shop.byRole.owner.id, { userId: null }, shop.shop.id);
    expect((await me(cookieA)).status).toBe(401);
    expect((await me(cookieB)).status).toBe(401);
  });
});

describe('session cookie over https', () => {
  it('uses the __Host- prefix and Secure when PUBLIC_URL is https, still HttpOnly and SameSite', async () => {
    const secure = await createTestContext({ env: { PUBLIC_URL: 'https://tappet.test' } });
    try {
      const s = await seedShop(secure, ['viewer']);
      const res = await request(secure.app)
        .post('/api/auth/sign-in')
        .set(csrf)
        .set('Origin', 'https://tappet.test')
        .send({ email: s.byRole.viewer.email, password: s.password });
      const cookie = String(res.headers['set-cookie']);
      expect(cookie).toMatch(/^__Host-tappet_session=/);
      expect(cookie).toMatch(/; Secure/);
      expect(cookie).toMatch(/; HttpOnly/i);
      expect(cookie).toMatch(/; SameSite=Lax/i);
      expect(cookie).toMatch(/; Path=\//);
      expect(cookie).not.toMatch(/Domain=/i);
      const token = sessionTokenFrom(res, '__Host-tappet_session')!;
      expect((await request(secure.app).get('/api/me').set('Cookie', `__Host-tappet_session=${token}`)).status).toBe(200);
    } finally {
      await secure.close();
    }
  });
});
