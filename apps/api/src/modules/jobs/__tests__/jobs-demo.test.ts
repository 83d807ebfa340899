/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { jobStatuses } from '@tappet/contracts';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { ShopEntity } from '../../shops/shops.entity';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db, ctx.clock.now())).toBe(true);
}, 60_000);
afterAll(() => ctx.close());

it('seeds jobs at every stage, one waiting for parts with a failed brake item, and my jobs for the mechanic', async () => {
  const shop = await ctx.db.reader.findOneByOrFail(ShopEntity, { slug: 'harbour-works' });
  const mechanic = await signedInAgent(ctx.app, 'mechanic@harbour-works.test', demoPassword);
  const board = await mechanic.get(`/api/shops/${shop.id}/jobs?closed=true`);
  expect(board.status).toBe(200);
  const jobs = board.body.jobs as Array<{ id: string; status: string; blockerCount: number }>;
  expect(new Set(jobs.map((j) => j.status))).toEqual(new Set(jobStatuses));
  const waiting = jobs.find((j) => j.status === 'waiting_parts')!;
  const detail = await mechanic.get(`/api/shops/${shop.id}/jobs/${waiting.id}`);
  expect(detail.body.blockers.map((b: { key: string }) => b.key)).toContain('brake-hydraulics');
  expect(detail.body.specialOrders).toHaveLength(1);
  expect(detail.body.checklists[0].records['tyre-age'].tyres[1].pre2000).toBe(true);
  const done = jobs.find((j) => j.status === 'done')!;
  const doneDetail = await mechanic.get(`/api/shops/${shop.id}/jobs/${done.id}`);
  expect(doneDetail.body.checklists[0].completedAt).not.toBeNull();
  expect(doneDetail.body.signOffs).toHaveLength(1);
  const mine = await mechanic.get(`/api/shops/${shop.id}/jobs?assignee=me`);
  expect(mine.body.jobs.length).toBeGreaterThan(1);
}, 60_000);
