/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, csrf, type TestContext } from '../../../test-support/test-app';
import { checkLedger } from '../stock.ledger-check';

let ctx: TestContext;
let seedMs = 0;
beforeAll(async () => {
  ctx = await createTestContext();
  const started = performance.now();
  expect(await seedDemo(ctx.db, ctx.clock.now())).toBe(true);
  seedMs = performance.now() - started;
}, 60_000);
afterAll(() => ctx.close());

async function owner() {
  const agent = request.agent(ctx.app);
  const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email: 'owner@harbour-works.test', password: demoPassword });
  return { agent, shopId: res.body.activeShopId as string };
}

describe('the demo stock', () => {
  it('is a ledger that check:ledger accepts, seeded quickly', async () => {
    expect(await checkLedger(ctx.db.reader)).toEqual([]);
    // The whole seed (every capability's demo, password hashes included) stays a matter of
    // seconds: a few alone; the bound is loose because test files run in parallel.
    expect(seedMs).toBeLessThan(20_000);
  });

  it('spreads Harbour Works stock over bins and conditions with two years of movements, holds and serialised engines', async () => {
    const { agent, shopId } = await owner();
    const bins = (await agent.get(`/api/shops/${shopId}/stock/bins`).expect(200)).body.bins;
    expect(bins.length).toBeGreaterThanOrEqual(20);
    const report = (await agent.get(`/api/shops/${shopId}/stock/valuation`).expect(200)).body;
    expect(report.byCondition.map((g: { key: string }) => g.key)).toEqual(expect.arrayContaining(['new', 'nos', 'used_good', 'reconditioned']));
    expect(report.totalMinor).toBeGreaterThan(0);
    const history = (await agent.get(`/api/shops/${shopId}/stock/valuation/history?months=24`).expect(200)).body.points;
    expect(history).toHaveLength(24);
    expect(history[0].valueMinor).toBeGreaterThan(0); // stock already on the shelves two years ago
    const oldest = (await agent.get(`/api/shops/${shopId}/stock/movements?to=${new Date(ctx.clock.now().getTime() - 600 * 86_400_000).toISOString().slice(0, 10)}&pageSize=1`).expect(200)).body;
    expect(oldest.total).toBeGreaterThan(0);
    const kinds = await ctx.db.reader.query<Array<{ kind: string }>>(`SELECT DISTINCT kind FROM stock_movements WHERE shop_id = ? ORDER BY kind`, [shopId]);
    expect(kinds.map((k) => k.kind)).toEqual(['adjusted', 'counted', 'issued', 'moved', 'received', 'returned']);
    expect((await agent.get(`/api/shops/${shopId}/stock/holds`).expect(200)).body.holds.length).toBeGreaterThanOrEqual(3);
    const engine = (await agent.get(`/api/shops/${shopId}/parts/search?q=71-0350E`).expect(200)).body.results[0];
    const engines = (await agent.get(`/api/shops/${shopId}/stock/parts/${engine.id}`).expect(200)).body;
    expect(engines.serials.filter((s: { inStock: boolean }) => s.inStock).length).toBe(3);
    expect(engines.valuation.every((v: { method: string }) => v.method === 'specific')).toBe(true);
  });

  it('shows none of 67-4410 but 3 of its replacement in bin B-04', async () => {
    const { agent, shopId } = await owner();
    const results = (await agent.get(`/api/shops/${shopId}/parts/search?q=67-4410`).expect(200)).body.results;
    expect(results[0]).toMatchObject({ number: '67-4410', stock: { onHand: 0 } });
    const replacement = results.find((r: { number: string }) => r.number === '70-4411');
    expect(replacement.stock.lines).toEqual(expect.arrayContaining([expect.objectContaining({ binCode: 'B-04', condition: 'new', onHand: 3 })]));
  });
});
