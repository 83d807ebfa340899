// Issue 15: two API processes on one database share what a client could otherwise play off against
// them. Each test runs a second app on the same database file with its own connection and write
// lock, as a second process would, and checks that it sees what the first one counted or stored.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createTestContext, csrf, openSecondInstance, seedShop, signedInAgent, type TestContext } from '../test-support/test-app';

let ctx: TestContext | undefined;
let second: Awaited<ReturnType<typeof openSecondInstance>> | undefined;
afterEach(async () => {
  await second?.close();
  await ctx?.close();
  second = ctx = undefined;
});

const signIn = (app: TestContext['app'], email: string, password: string) => request(app).post('/api/auth/sign-in').set(csrf).send({ email, password });

describe('rate limits across two app instances', () => {
  it('counts failed sign-ins made on either instance against one allowance', async () => {
    ctx = await createTestContext();
    second = await openSecondInstance(ctx);
    const shop = await seedShop(ctx, ['owner']);
    const email = shop.byRole.owner.email;
    // 10 failures allowed per account in 15 minutes: five here, five there.
    for (let i = 0; i < 5; i++) expect((await signIn(ctx.app, email, `wrong-${i}`)).status).toBe(401);
    for (let i = 0; i < 5; i++) expect((await signIn(second.app, email, `wrong-${i}`)).status).toBe(401);
    // Each instance alone has seen only five, yet both refuse now.
    expect((await signIn(ctx.app, email, shop.password)).status).toBe(429);
    expect((await signIn(second.app, email, shop.password)).status).toBe(429);
    ctx.clock.advance(15 * 60_000 + 1000);
    expect((await signIn(second.app, email, shop.password)).status).toBe(200);
  });

  it('shares the hourly e-mail allowance of a person', async () => {
    ctx = await createTestContext({ deps: { mailRequestLimit: { limit: 2, windowMs: 60 * 60_000 } } });
    second = await openSecondInstance(ctx, { mailRequestLimit: { limit: 2, windowMs: 60 * 60_000 } });
    const shop = await seedShop(ctx, ['buyer']);
    const onFirst = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
    const onSecond = await signedInAgent(second.app, shop.byRole.buyer.email, shop.password);
    const send = (agent: typeof onFirst) => agent.post(`/api/shops/${shop.shop.id}/purchasing/orders/${randomUUID()}/send`).set(csrf);
    expect((await send(onFirst)).status).toBe(404);
    expect((await send(onSecond)).status).toBe(404);
    expect((await send(onFirst)).status).toBe(429);
    expect((await send(onSecond)).status).toBe(429);
  });
});
