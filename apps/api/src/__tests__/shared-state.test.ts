// Issue 15: two API processes on one database share what a client could otherwise play off against
// them, and neither keeps answering from a cache the other has made stale. Each test runs a second
// app on the same database file with its own connection and write lock, as a second process would.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { catalogueVersionCheckMs } from '../modules/catalogue/catalogue.service';
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

describe('the catalogue across two app instances', () => {
  it('a link added on one instance shows in the other instance\'s lineage within the version check interval', async () => {
    ctx = await createTestContext();
    second = await openSecondInstance(ctx);
    const shop = await seedShop(ctx, ['owner']);
    const onFirst = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const onSecond = await signedInAgent(second.app, shop.byRole.owner.email, shop.password);
    const base = `/api/shops/${shop.shop.id}`;
    const part = async (number: string) => (await onFirst.post(`${base}/parts`).set(csrf).send({ number, description: `Shared state ${number}` })).body.id as string;
    const [older, newer] = [await part('SS-100'), await part('SS-101')];
    const edgesSeenBy = async (agent: typeof onFirst) => (await agent.get(`${base}/parts/${older}/lineage`)).body.edges as unknown[];
    // The second instance builds and caches the shop's graph: no links yet.
    expect(await edgesSeenBy(onSecond)).toEqual([]);
    expect((await onFirst.post(`${base}/part-links`).set(csrf).send({ fromPartId: older, kind: 'replaced_by', toPartId: newer })).status).toBe(201);
    // The writing instance knows at once; the other one once its reading of the version is due again.
    expect(await edgesSeenBy(onFirst)).toHaveLength(1);
    ctx.clock.advance(catalogueVersionCheckMs);
    expect(await edgesSeenBy(onSecond)).toHaveLength(1);
  });
});
