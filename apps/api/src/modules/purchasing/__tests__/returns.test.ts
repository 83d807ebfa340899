import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { StockLineEntity, StockPoolEntity } from '../../stock/stock.entity';
import { addBin, addPart, addSupplier, post, type Agent } from './helpers';

let ctx: TestContext;
let owner: Agent;
let buyer: Agent;
let viewer: Agent;
let shopId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
});
afterAll(() => ctx.close());

/** A received order of `quantity` at `price` with a core deposit; returns the ids. */
async function receivedOrder(quantity: number, price: number, coreDepositMinor = 0) {
  const supplierId = await addSupplier(owner, shopId);
  const partId = await addPart(owner, shopId, `RT-${Math.random().toString(36).slice(2, 7)}`);
  const binId = await addBin(owner, shopId, `RT${Math.random().toString(36).slice(2, 6)}`);
  const order = await post(owner, shopId, '/orders', { supplierId, lines: [{ partId, quantity, unitPriceMinor: price, coreDepositMinor }] }, 201);
  await post(owner, shopId, `/orders/${order.id}/send`, {});
  await post(buyer, shopId, `/orders/${order.id}/receipts`, { lines: [{ lineId: order.lines[0].id, quantity, binId }] });
  return { supplierId, partId, binId, orderId: order.id as string, lineId: order.lines[0].id as string };
}

describe('returns to suppliers', () => {
  it('take faulty parts out of stock with the reason and stay open until credited', async () => {
    const o = await receivedOrder(5, 800);
    const ret = await post(buyer, shopId, '/returns', { supplierId: o.supplierId, lineId: o.lineId, partId: o.partId, binId: o.binId, quantity: 2, reason: 'Threads stripped on arrival' }, 201);
    expect(ret).toMatchObject({ kind: 'return', status: 'open', quantity: 2, expectedCreditMinor: 1600, orderId: o.orderId });
    expect(await ctx.db.reader.findOne(StockLineEntity, { where: { shopId, partId: o.partId, binId: o.binId } })).toMatchObject({ onHand: 3 });
    expect(await ctx.db.reader.findOne(StockPoolEntity, { where: { shopId, partId: o.partId } })).toMatchObject({ quantity: 3, valueMinor: 2400 });
    const credited = await post(buyer, shopId, `/returns/${ret.id}/credit`, { creditedMinor: 1600, creditReference: 'CN-4471' });
    expect(credited).toMatchObject({ status: 'credited', creditedMinor: 1600, creditReference: 'CN-4471' });
    expect((await buyer.post(`/api/shops/${shopId}/purchasing/returns/${ret.id}/credit`).set(csrf).send({ creditedMinor: 1 })).status).toBe(409);
    expect((await viewer.post(`/api/shops/${shopId}/purchasing/returns`).set(csrf).send({ supplierId: o.supplierId, partId: o.partId, binId: o.binId, quantity: 1, reason: 'Viewer try', expectedCreditMinor: 1 })).status).toBe(403);
  });

  it('refuse more than is free, leaving stock as it was', async () => {
    const o = await receivedOrder(1, 500);
    const res = await buyer.post(`/api/shops/${shopId}/purchasing/returns`).set(csrf).send({ supplierId: o.supplierId, partId: o.partId, binId: o.binId, quantity: 2, reason: 'Wrong part sent', expectedCreditMinor: 1000 });
    expect(res.status).toBe(409);
    expect((await buyer.get(`/api/shops/${shopId}/purchasing/returns`)).body.returns.filter((r: { partId: string }) => r.partId === o.partId)).toEqual([]);
  });
});

describe('core deposits', () => {
  it('expect the deposit back for each core returned, no more cores than were received', async () => {
    const o = await receivedOrder(2, 4000, 1500);
    const core = await post(buyer, shopId, '/returns', { kind: 'core', supplierId: o.supplierId, lineId: o.lineId, partId: o.partId, quantity: 2, reason: 'Old calipers back for exchange' }, 201);
    expect(core).toMatchObject({ kind: 'core', expectedCreditMinor: 3000, status: 'open' });
    // Cores are not taken out of stock.
    expect(await ctx.db.reader.findOne(StockPoolEntity, { where: { shopId, partId: o.partId } })).toMatchObject({ quantity: 2 });
    const more = await buyer.post(`/api/shops/${shopId}/purchasing/returns`).set(csrf).send({ kind: 'core', supplierId: o.supplierId, lineId: o.lineId, partId: o.partId, quantity: 1, reason: 'One more' });
    expect(more.status).toBe(409);
    expect(more.body.error.message).toBe('Only 0 core(s) are still owed a deposit on that line.');
    expect(await post(buyer, shopId, `/returns/${core.id}/credit`, { creditedMinor: 3000 })).toMatchObject({ status: 'credited' });
  });
});
