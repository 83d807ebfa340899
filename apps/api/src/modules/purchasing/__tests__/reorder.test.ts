import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ReorderSuggestion } from '@tappet/contracts';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createBin, issueStock, receiveStock } from '../../stock/stock.service';
import { addPart, addSupplier, post, type Agent } from './helpers';

const DAY = 86_400_000;
let ctx: TestContext;
let owner: Agent;
let buyer: Agent;
let shopId: string;
const ids: Record<string, string> = {};

/** Receives `quantity` of a part `daysAgo` days back, then issues `perDay` on each of the last `days` days. */
async function history(partNumber: string, receive: { quantity: number; unitCostMinor: number; daysAgo: number }, issues: { perDay: number; days: number } | null) {
  const now = ctx.clock.now().getTime();
  await ctx.db.write(async (manager) => {
    const actor = { userId: null };
    const line = { partId: ids[partNumber]!, binId: ids['bin']!, condition: 'new' as const };
    await receiveStock(manager, shopId, { ...line, quantity: receive.quantity, unitCostMinor: receive.unitCostMinor }, { actor, at: new Date(now), occurredAt: new Date(now - receive.daysAgo * DAY) });
    for (let d = 0; d < (issues?.days ?? 0); d++) {
      await issueStock(manager, shopId, { ...line, quantity: issues!.perDay }, { actor, at: new Date(now), occurredAt: new Date(now - d * DAY) });
    }
  });
}

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  for (const n of ['OLD-1', 'NEW-1', 'OLDB-1', 'NEW-2', 'SPLIT-0', 'SPL-A', 'SPL-B', 'MM-1', 'DEAD-1']) ids[n] = await addPart(owner, shopId, n);
  const link = (from: string, to: string, interchange: string) => owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: ids[from], kind: 'replaced_by', toNumber: to, interchange });
  expect((await link('OLD-1', 'NEW-1', 'one_way')).status).toBe(201);
  expect((await link('OLDB-1', 'NEW-2', 'both')).status).toBe(201);
  expect((await link('SPLIT-0', 'SPL-A', 'both')).status).toBe(201);
  expect((await link('SPLIT-0', 'SPL-B', 'both')).status).toBe(201);
  ids['bin'] = await ctx.db.write(async (manager) => (await createBin(manager, shopId, { code: 'R-01' }, { actor: { userId: null }, at: ctx.clock.now() })).id);
  ids['supplier'] = await addSupplier(owner, shopId, { name: 'Marrick Spares', leadTimeDays: 7, minOrderValueMinor: 100_000 });
  await post(owner, shopId, `/suppliers/${ids['supplier']}/listings`, { partId: ids['NEW-1'], priceMinor: 500, packSize: 6, minOrderQty: 12 }, 201);
  await post(owner, shopId, `/suppliers/${ids['supplier']}/listings`, { partId: ids['MM-1'], priceMinor: 200 }, 201);
  await owner.patch(`/api/shops/${shopId}/purchasing/settings`).set(csrf).send({ demandWindowDays: 30, deadStockDays: 365 });

  await history('OLD-1', { quantity: 100, unitCostMinor: 450, daysAgo: 60 }, { perDay: 2, days: 30 });
  await history('NEW-2', { quantity: 30, unitCostMinor: 300, daysAgo: 60 }, { perDay: 1, days: 30 });
  await history('OLDB-1', { quantity: 20, unitCostMinor: 300, daysAgo: 60 }, null);
  await history('SPLIT-0', { quantity: 10, unitCostMinor: 900, daysAgo: 60 }, { perDay: 1, days: 10 });
  await history('DEAD-1', { quantity: 5, unitCostMinor: 1000, daysAgo: 400 }, null);
  await buyer.put(`/api/shops/${shopId}/purchasing/parts/${ids['MM-1']}`).set(csrf).send({ preferredSupplierId: ids['supplier'], minQty: 2, maxQty: 10 });
});
afterAll(() => ctx.close());

const reorderList = async () => {
  const res = await buyer.get(`/api/shops/${shopId}/purchasing/reorder-list`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
};
const suggestionFor = (list: { suggestions: ReorderSuggestion[] }, n: string) => list.suggestions.find((s) => s.partNumber === n) as ReorderSuggestion | undefined;

describe('the reorder list', () => {
  it('rolls a one-way predecessor’s demand into the current part, and offsets only that demand with its stock', async () => {
    const s = suggestionFor(await reorderList(), 'NEW-1')!;
    // 2 a day for 30 days under OLD-1; no spread. Lead time 7 days → ROP 14, no safety stock.
    expect(s.demand).toMatchObject({ windowDays: 30, total: 60, meanPerDay: 2, sdPerDay: 0, fedBy: [{ number: 'OLD-1', quantity: 60, ownDemandOnly: true }] });
    expect(s.reorderPoint).toBeCloseTo(14, 9);
    expect(s.safetyStock).toBe(0);
    // OLD-1 still has 40 free, but only 2 a day × 7 days of its own demand can use them.
    expect(s.supply).toEqual({ free: 0, onOrder: 0, substitutes: 14, position: 14 });
    // EOQ √(2 · 730 · 2500 / (500 · 0.25)) = √29,200 = 170.88 → 29 packs of 6 = 174.
    expect(s.eoq).toBeCloseTo(Math.sqrt(29_200), 9);
    expect(s.quantity).toBe(174);
    expect(s.reasons[0]).toBe('Demand includes issues under OLD-1, which resolve to NEW-1.');
    expect(s.reasons.some((r) => r.startsWith('Rounded up from 170.88 to 174 for packs of 6 and a minimum order of 12'))).toBe(true);
    expect(s.history).toHaveLength(30);
    expect(s.history.at(-1)).toEqual({ date: '2026-01-15', byNumber: { 'OLD-1': 2 } });
  });

  it('counts a both-ways predecessor’s stock fully, and splits demand for a split number into its pieces', async () => {
    const list = await reorderList();
    // NEW-2: 1 a day, 7-day lead time → ROP 7; OLDB-1's 20 fill it, so nothing is due.
    expect(suggestionFor(list, 'NEW-2')).toBeUndefined();
    for (const piece of ['SPL-A', 'SPL-B']) {
      const s = suggestionFor(list, piece)!;
      expect(s.demand.fedBy).toEqual([{ partId: ids['SPLIT-0'], number: 'SPLIT-0', quantity: 10, ownDemandOnly: true }]);
      expect(s.supplierId).toBeNull();
      expect(s.reasons.at(-1)).toBe('No supplier lists this part: add a listing to order it.');
    }
  });

  it('handles a part with no history by its manual min/max, groups by supplier with the shortfall, and reports dead stock', async () => {
    const list = await reorderList();
    expect(suggestionFor(list, 'MM-1')).toMatchObject({ method: 'min_max', quantity: 10, reorderPoint: 2 });
    const group = list.groups.find((g: { supplierId: string | null }) => g.supplierId === ids['supplier']);
    // 174 × 500 + 10 × 200 = 89,000 against a minimum of 100,000.
    expect(group).toMatchObject({ totalMinor: 89_000, minOrderValueMinor: 100_000, shortfallMinor: 11_000 });
    expect(list.deadStock).toEqual(expect.arrayContaining([expect.objectContaining({ partNumber: 'DEAD-1', onHand: 5, valueMinor: 5000, lastIssuedAt: null })]));
    expect(list.deadStock.map((d: { partNumber: string }) => d.partNumber)).not.toContain('OLD-1');
  });

  it('turns suggestions into one draft per supplier, after which they count as on order', async () => {
    const res = await buyer.post(`/api/shops/${shopId}/purchasing/orders/from-reorder`).set(csrf).send({ partIds: [ids['NEW-1'], ids['MM-1'], ids['SPL-A']] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.orders).toHaveLength(1);
    expect(res.body.orders[0]).toMatchObject({ status: 'draft', supplierId: ids['supplier'], totalMinor: 89_000 });
    expect(res.body.orders[0].lines.map((l: { partNumber: string; quantity: number }) => [l.partNumber, l.quantity])).toEqual([
      ['NEW-1', 174],
      ['MM-1', 10],
    ]);
    expect(res.body.skipped).toEqual([{ partId: ids['SPL-A'], reason: 'No supplier lists this part.' }]);
    const after = await reorderList();
    expect(suggestionFor(after, 'NEW-1')).toBeUndefined();
    expect(suggestionFor(after, 'MM-1')).toBeUndefined();
  });

  it('counts a part’s free stock over all its bins, and never its cores', async () => {
    ids['FREE-1'] = await addPart(owner, shopId, 'FREE-1');
    ids['bin2'] = await ctx.db.write(async (manager) => (await createBin(manager, shopId, { code: 'R-02' }, { actor: { userId: null }, at: ctx.clock.now() })).id);
    await ctx.db.write(async (manager) => {
      const at = { actor: { userId: null }, at: ctx.clock.now() };
      await receiveStock(manager, shopId, { partId: ids['FREE-1']!, binId: ids['bin']!, condition: 'new', quantity: 4, unitCostMinor: 100 }, at);
      await receiveStock(manager, shopId, { partId: ids['FREE-1']!, binId: ids['bin2']!, condition: 'used_good', quantity: 3, unitCostMinor: 100 }, at);
      await receiveStock(manager, shopId, { partId: ids['FREE-1']!, binId: ids['bin']!, condition: 'core', quantity: 50, unitCostMinor: 10 }, at);
    });
    expect((await buyer.put(`/api/shops/${shopId}/purchasing/parts/${ids['FREE-1']}`).set(csrf).send({ preferredSupplierId: null, minQty: 10, maxQty: 20 })).status).toBe(200);
    // 4 + 3 free: below the minimum of 10, so up to the maximum of 20. The 50 cores would cover it.
    expect(suggestionFor(await reorderList(), 'FREE-1')).toMatchObject({ method: 'min_max', supply: { free: 7, onOrder: 0, substitutes: 0, position: 7 }, quantity: 13 });
  });
});
