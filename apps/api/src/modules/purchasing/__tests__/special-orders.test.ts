import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { JobSpecialOrderEntity } from '../../jobs/jobs.entity';
import { HoldEntity, StockPoolEntity } from '../../stock/stock.entity';
import { seedVehicleFixture } from '../../vehicles/vehicles.test-fixture';
import { addBin, addPart, addSupplier, post, type Agent } from './helpers';

let ctx: TestContext;
let owner: Agent;
let buyer: Agent;
let outsider: Agent;
let shopId: string;
let otherShopId: string;
let vehicleId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  const other = await seedShop(ctx, ['owner']);
  otherShopId = other.shop.id;
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  vehicleId = (await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0)).vehicleId;
}, 60_000);
afterAll(() => ctx.close());

async function newJob(): Promise<{ id: string; number: number }> {
  const res = await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId, title: 'Rebuild the front calipers', customerRequest: '' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

async function specialOrder(jobId: string, partId: string, quantity: number): Promise<string> {
  const res = await owner.post(`/api/shops/${shopId}/jobs/${jobId}/special-orders`).set(csrf).send({ partId, quantity });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const row = await ctx.db.reader.findOne(JobSpecialOrderEntity, { where: { shopId, jobId, partId }, order: { createdAt: 'DESC' } });
  return row!.id;
}

const statusOf = async (id: string) => (await ctx.db.reader.findOne(JobSpecialOrderEntity, { where: { shopId, id } }))!.status;
const reorderList = async () => (await buyer.get(`/api/shops/${shopId}/purchasing/reorder-list`)).body;

describe('special orders on the reorder list', () => {
  it('lists a job’s special order rounded to the pack, drafts it linked, marks it ordered when sent, and holds what arrives for the job', async () => {
    const supplierId = await addSupplier(owner, shopId, { name: 'Larchfield Seals' });
    const partId = await addPart(owner, shopId, 'CS-4410');
    const binId = await addBin(owner, shopId, 'SO-1');
    await post(owner, shopId, `/suppliers/${supplierId}/listings`, { partId, priceMinor: 350, packSize: 4 }, 201);
    const job = await newJob();
    const soId = await specialOrder(job.id, partId, 6);

    const list = await reorderList();
    const row = list.specialOrders.find((s: { specialOrderId: string }) => s.specialOrderId === soId);
    // 6 wanted, packs of 4 → 2 packs = 8 units at 3.50 each.
    expect(row).toMatchObject({ jobId: job.id, jobNumber: job.number, partNumber: 'CS-4410', needed: 6, quantity: 8, supplierId, unitPriceMinor: 350, valueMinor: 2800 });
    expect(list.groups.find((g: { supplierId: string }) => g.supplierId === supplierId)).toMatchObject({ specialOrderIds: [soId], totalMinor: 2800 });

    const drafted = await post(buyer, shopId, '/orders/from-reorder', { specialOrderIds: [soId] }, 201);
    expect(drafted.skipped).toEqual([]);
    const order = drafted.orders[0];
    expect(order.lines).toEqual([expect.objectContaining({ partId, quantity: 8, specialOrderId: soId, purpose: `Special order for job ${job.number}` })]);
    // On a draft it leaves the list (not offered twice) but the job still sees it as open until it is sent.
    expect((await reorderList()).specialOrders.map((s: { specialOrderId: string }) => s.specialOrderId)).not.toContain(soId);
    expect(await statusOf(soId)).toBe('open');
    // A second order cannot take the same special order.
    const dup = await buyer.post(`/api/shops/${shopId}/purchasing/orders`).set(csrf).send({ supplierId, lines: [{ partId, quantity: 6, specialOrderId: soId }] });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details.reason).toBe('special_order_taken');

    await post(buyer, shopId, `/orders/${order.id}/send`, {});
    expect(await statusOf(soId)).toBe('ordered');

    // 4 arrive: all 4 held for the job, the special order still waits for 2 more.
    await post(buyer, shopId, `/orders/${order.id}/receipts`, { lines: [{ lineId: order.lines[0].id, quantity: 4, binId }] });
    expect(await statusOf(soId)).toBe('ordered');
    // The other 4: only 2 more are held (the job asked for 6), the pack's other 2 stay free.
    await post(buyer, shopId, `/orders/${order.id}/receipts`, { lines: [{ lineId: order.lines[0].id, quantity: 4, binId }] });
    expect(await statusOf(soId)).toBe('received');
    const holds = await ctx.db.reader.find(HoldEntity, { where: { shopId, partId }, order: { createdAt: 'ASC' } });
    expect(holds.map((h) => [h.quantity, h.jobId, h.status])).toEqual([
      [4, job.id, 'active'],
      [2, job.id, 'active'],
    ]);
    expect(holds[0]!.purpose).toBe(`Special order for job ${job.number} (${order.reference})`);
    const pool = await ctx.db.reader.findOne(StockPoolEntity, { where: { shopId, partId, condition: 'new' } });
    expect(pool).toMatchObject({ quantity: 8, valueMinor: 2800 });
  });

  it('offers a special order again when its draft is cancelled, and skips one without a supplier', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'CS-4420');
    const unlisted = await addPart(owner, shopId, 'CS-4421');
    await post(owner, shopId, `/suppliers/${supplierId}/listings`, { partId, priceMinor: 900 }, 201);
    const job = await newJob();
    const soId = await specialOrder(job.id, partId, 1);
    const lonely = await specialOrder(job.id, unlisted, 1);
    const drafted = await post(buyer, shopId, '/orders/from-reorder', { specialOrderIds: [soId, lonely] }, 201);
    expect(drafted.orders).toHaveLength(1);
    expect(drafted.skipped).toEqual([{ partId: unlisted, reason: `No supplier lists CS-4421 (special order for job ${job.number}).` }]);
    await post(buyer, shopId, `/orders/${drafted.orders[0].id}/cancel`, { reason: 'Wrong supplier' });
    expect((await reorderList()).specialOrders.map((s: { specialOrderId: string }) => s.specialOrderId)).toEqual(expect.arrayContaining([soId, lonely]));
  });

  it('brings a special order back for what is missing when its sent order is closed short', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'CS-4440');
    const binId = await addBin(owner, shopId, 'SO-2');
    await post(owner, shopId, `/suppliers/${supplierId}/listings`, { partId, priceMinor: 500 }, 201);
    const job = await newJob();
    const soId = await specialOrder(job.id, partId, 3);
    const first = (await post(buyer, shopId, '/orders/from-reorder', { specialOrderIds: [soId] }, 201)).orders[0];
    await post(buyer, shopId, `/orders/${first.id}/send`, {});
    await post(buyer, shopId, `/orders/${first.id}/receipts`, { lines: [{ lineId: first.lines[0].id, quantity: 1, binId }] });
    await post(buyer, shopId, `/orders/${first.id}/close`, { reason: 'Supplier cannot get the rest' });
    // The job sees it waiting to be bought again.
    expect(await statusOf(soId)).toBe('open');
    const row = (await reorderList()).specialOrders.find((s: { specialOrderId: string }) => s.specialOrderId === soId);
    expect(row).toMatchObject({ needed: 2, quantity: 2 });

    // Bought again elsewhere: 2 more arrive and are held; the job now has its 3.
    const second = (await post(buyer, shopId, '/orders/from-reorder', { specialOrderIds: [soId] }, 201)).orders[0];
    await post(buyer, shopId, `/orders/${second.id}/send`, {});
    await post(buyer, shopId, `/orders/${second.id}/receipts`, { lines: [{ lineId: second.lines[0].id, quantity: 2, binId }] });
    expect(await statusOf(soId)).toBe('received');
    const held = (await ctx.db.reader.find(HoldEntity, { where: { shopId, partId, jobId: job.id } })).reduce((s, h) => s + h.quantity, 0);
    expect(held).toBe(3);
    expect((await reorderList()).specialOrders.map((s: { specialOrderId: string }) => s.specialOrderId)).not.toContain(soId);
  });

  it('refuses a special order for another part or from another shop on a hand-written order', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'CS-4430');
    const otherPart = await addPart(owner, shopId, 'CS-4431');
    const job = await newJob();
    const soId = await specialOrder(job.id, partId, 2);
    const wrongPart = await buyer.post(`/api/shops/${shopId}/purchasing/orders`).set(csrf).send({ supplierId, lines: [{ partId: otherPart, quantity: 2, unitPriceMinor: 100, specialOrderId: soId }] });
    expect(wrongPart.status).toBe(400);
    // The other shop cannot see or link this shop's special order.
    expect((await outsider.get(`/api/shops/${otherShopId}/purchasing/reorder-list`)).body.specialOrders).toEqual([]);
    const foreignSupplier = await addSupplier(outsider, otherShopId);
    const foreignPart = await addPart(outsider, otherShopId, 'CS-4430');
    const foreign = await outsider.post(`/api/shops/${otherShopId}/purchasing/orders`).set(csrf).send({ supplierId: foreignSupplier, lines: [{ partId: foreignPart, quantity: 2, unitPriceMinor: 100, specialOrderId: soId }] });
    expect(foreign.status).toBe(404);
    // By hand, in this shop, it links.
    const ok = await post(buyer, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 2, unitPriceMinor: 100, specialOrderId: soId }] }, 201);
    expect(ok.lines[0].specialOrderId).toBe(soId);
  });
});
