/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { ShopEntity } from '../../shops/shops.entity';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db, ctx.clock.now())).toBe(true);
}, 60_000);
afterAll(() => ctx.close());

it('seeds an estimate waiting for the customer, an approved one, and a settled consignment awaiting its payout', async () => {
  const shop = await ctx.db.reader.findOneByOrFail(ShopEntity, { slug: 'harbour-works' });
  const owner = await signedInAgent(ctx.app, 'owner@harbour-works.test', demoPassword);
  const estimates = (await owner.get(`/api/shops/${shop.id}/estimates`)).body.estimates as Array<{ status: string; grossMinor: number; approvedAmountMinor: number | null }>;
  expect(estimates.some((e) => e.status === 'sent')).toBe(true);
  const approved = estimates.filter((e) => e.status === 'approved');
  expect(approved.length).toBeGreaterThan(0);
  for (const e of approved) expect(e.approvedAmountMinor).toBe(e.grossMinor);
  const consigned = (await owner.get(`/api/shops/${shop.id}/consignment/vehicles`)).body.vehicles as Array<{ vehicleId: string; hasTerms: boolean; settlementReference: string | null; paid: boolean }>;
  const settled = consigned.find((v) => v.settlementReference);
  expect(settled).toMatchObject({ hasTerms: true, paid: false });
  const detail = (await owner.get(`/api/shops/${shop.id}/consignment/vehicles/${settled!.vehicleId}`)).body;
  const s = detail.settlement;
  // 10 % of 5 250.00 = 525.00; the approved pre-sale work; the rest is the payout.
  expect(s.commissionMinor).toBe(52_500);
  expect(s.payoutMinor).toBe(525_000 - 52_500 - s.workMinor);
  expect(s.work.length).toBe(1);
});
