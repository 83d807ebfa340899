/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, csrf, type TestContext } from '../../../test-support/test-app';
import { checkLedger } from '../../stock/stock.ledger-check';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db, ctx.clock.now())).toBe(true);
}, 60_000);
afterAll(() => ctx.close());

describe('the demo counts', () => {
  it('has one count posted (a part one short) and one in progress, with a ledger check:ledger accepts', async () => {
    const agent = request.agent(ctx.app);
    const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email: 'owner@harbour-works.test', password: demoPassword });
    const shopId = res.body.activeShopId as string;
    const { counts } = (await agent.get(`/api/shops/${shopId}/counts`).expect(200)).body as { counts: Array<{ id: string; number: number; status: string; lineCount: number; countedCount: number; differenceCount: number }> };
    expect(counts.map((c) => [c.number, c.status])).toEqual([
      [2, 'open'],
      [1, 'posted'],
    ]);
    const [open, posted] = counts;
    expect(open!.countedCount).toBe(2);
    expect(open!.lineCount).toBeGreaterThan(2);
    expect(open!.differenceCount).toBe(1);
    const report = (await agent.get(`/api/shops/${shopId}/counts/${posted!.id}/variances`).expect(200)).body;
    expect(report.totals.short).toBe(1);
    expect(report.postedValueMinor).toBeLessThan(0);
    expect(await checkLedger(ctx.db.reader)).toEqual([]);
  });
});
