/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { purchaseOrderStatuses } from '@tappet/contracts';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, csrf, type TestContext } from '../../../test-support/test-app';
import { checkLedger } from '../../stock/stock.ledger-check';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db, ctx.clock.now())).toBe(true);
}, 60_000);
afterAll(() => ctx.close());

async function signIn(email: string) {
  const agent = request.agent(ctx.app);
  const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email, password: demoPassword });
  return { agent, shopId: res.body.activeShopId as string };
}

describe('the demo purchasing', () => {
  it('has the three invented suppliers with listings, and orders in every state', async () => {
    const { agent, shopId } = await signIn('buyer@harbour-works.test');
    const suppliers = (await agent.get(`/api/shops/${shopId}/purchasing/suppliers`).expect(200)).body.suppliers;
    expect(suppliers.map((s: { name: string }) => s.name)).toEqual(['Hollin Pattern Co.', 'Marrick Spares', 'Tarnwell Reproductions']);
    for (const s of suppliers) expect(s.listingCount).toBeGreaterThan(0);
    const orders = (await agent.get(`/api/shops/${shopId}/purchasing/orders`).expect(200)).body.orders;
    expect(new Set(orders.map((o: { status: string }) => o.status))).toEqual(new Set(purchaseOrderStatuses));
    const returns = (await agent.get(`/api/shops/${shopId}/purchasing/returns`).expect(200)).body.returns;
    expect(returns.map((r: { kind: string; status: string }) => `${r.kind}:${r.status}`).sort()).toEqual(['core:credited', 'return:open']);
  });

  it('keeps the stock ledger consistent and gives a reorder list with suggestions', async () => {
    expect(await checkLedger(ctx.db.reader)).toEqual([]);
    const { agent, shopId } = await signIn('buyer@harbour-works.test');
    const list = (await agent.get(`/api/shops/${shopId}/purchasing/reorder-list`).expect(200)).body;
    expect(list.suggestions.length).toBeGreaterThan(0);
    expect(list.groups.length).toBeGreaterThan(0);
  });
});
