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

describe('the sales demo', () => {
  it('has invoices in every state, a counter sale and a credit note, numbered without gaps, and a consistent stock ledger', async () => {
    const agent = request.agent(ctx.app);
    const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email: 'owner@harbour-works.test', password: demoPassword });
    const shopId = res.body.activeShopId as string;
    const list = await agent.get(`/api/shops/${shopId}/sales/invoices?pageSize=100`).expect(200);
    const docs = list.body.invoices as Array<{ kind: string; status: string; paymentStatus: string; source: string; number: string | null }>;
    const invoices = docs.filter((d) => d.kind === 'invoice');
    expect(invoices.some((d) => d.status === 'draft')).toBe(true);
    for (const state of ['unpaid', 'part_paid', 'paid']) expect(invoices.some((d) => d.status === 'issued' && d.paymentStatus === state), state).toBe(true);
    expect(invoices.some((d) => d.source === 'counter' && d.status === 'issued')).toBe(true);
    expect(docs.filter((d) => d.kind === 'credit_note').map((d) => d.number)).toEqual(['CN-00001']);
    const numbers = invoices.flatMap((d) => (d.number ? [Number(d.number.slice(4))] : [])).sort((a, b) => a - b);
    expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1));
    expect(await checkLedger(ctx.db.reader)).toEqual([]);
  });
});
