import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext | undefined;
afterEach(async () => {
  await ctx?.close();
  ctx = undefined;
});

const signIn = (c: TestContext, email: string, password: string) => request(c.app).post('/api/auth/sign-in').set(csrf).send({ email, password });

describe('sign-in rate limits', () => {
  it('locks an account after 10 failures in 15 minutes, even for the right password, with Retry-After', async () => {
    ctx = await createTestContext();
    const shop = await seedShop(ctx, ['owner']);
    const email = shop.byRole.owner.email;
    for (let i = 0; i < 10; i++) expect((await signIn(ctx, email, `wrong-${i}`)).status).toBe(401);

    const limited = await signIn(ctx, email, shop.password);
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(limited.body.error.message).toMatch(/Too many failed sign-in attempts\. Try again in 15 minutes\./);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(800);

    ctx.clock.advance(15 * 60_000 + 1000);
    expect((await signIn(ctx, email, shop.password)).status).toBe(200);
  });

  it('clears the account counter after a successful sign-in', async () => {
    ctx = await createTestContext();
    const shop = await seedShop(ctx, ['owner']);
    const email = shop.byRole.owner.email;
    for (let i = 0; i < 9; i++) await signIn(ctx, email, 'wrong-password');
    expect((await signIn(ctx, email, shop.password)).status).toBe(200);
    for (let i = 0; i < 9; i++) expect((await signIn(ctx, email, 'wrong-password')).status).toBe(401);
  });

  it('limits failures per address across accounts', async () => {
    ctx = await createTestContext({ deps: { authLimits: { signInFailuresPerIp: { limit: 3, windowMs: 15 * 60_000 } } } });
    const shop = await seedShop(ctx, ['owner']);
    for (const who of ['a@nowhere.test', 'b@nowhere.test', 'c@nowhere.test']) expect((await signIn(ctx, who, 'guess-guess')).status).toBe(401);
    const res = await signIn(ctx, shop.byRole.owner.email, shop.password);
    expect(res.status).toBe(429);
    expect(res.headers['retry-after']).toBeDefined();
  });
});
