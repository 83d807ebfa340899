import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';

// A shop-stock vehicle's total cost (acquisition + all its jobs) against its asking price (issue 10).

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let owner: Agent;
let mechanic: Agent;
let viewer: Agent;
let outsider: Agent;
let mechanicId: string;
let stock: StockFixture;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  mechanicId = shop.byRole.mechanic.id;
  stock = await seedStockFixture(ctx.db, shopId, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
}, 60_000);
afterAll(() => ctx.close());

describe('vehicle cost and margin', () => {
  it('adds every job’s parts at cost and labour to the acquisition cost, against the asking price', async () => {
    const vehicle = await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Corran', model: 'Tern 350', year: 1967, frameNumber: 'CT 41207', acquisitionCostMinor: 180_000, askingPriceMinor: 250_000 });
    expect(vehicle.status, JSON.stringify(vehicle.body)).toBe(201);
    const vehicleId = vehicle.body.id as string;
    const costs = () => owner.get(`/api/shops/${shopId}/vehicles/${vehicleId}/costs`);

    const bare = await costs();
    expect(bare.status).toBe(200);
    expect(bare.body).toMatchObject({ acquisitionCostMinor: 180_000, askingPriceMinor: 250_000, jobsMinor: 0, totalCostMinor: 180_000, marginMinor: 70_000, marginPercent: 28 });

    const jobUrl = `/api/shops/${shopId}/jobs`;
    const first = await owner.post(jobUrl).set(csrf).send({ vehicleId, title: 'Recommission', customerRequest: '', assigneeIds: [mechanicId] });
    const second = await owner.post(jobUrl).set(csrf).send({ vehicleId, title: 'Pre-sale check', customerRequest: '', assigneeIds: [mechanicId] });
    // Parts: 3 issued at 2.50, 1 returned at the cost it left at: 5.00 on the first job.
    expect((await mechanic.post(`${jobUrl}/${first.body.id as string}/parts/issues`).set(csrf).send({ partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 3 })).status).toBe(201);
    expect((await mechanic.post(`${jobUrl}/${first.body.id as string}/parts/returns`).set(csrf).send({ partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 1 })).status).toBe(201);
    // Labour: 1.5 h at the default 60.00 an hour = 90.00 on the first, 20 min = 20.00 on the second.
    expect((await mechanic.post(`${jobUrl}/${first.body.id as string}/labour`).set(csrf).send({ userId: mechanicId, workedOn: '2026-01-15', minutes: 90, description: 'Carburettors' })).status).toBe(201);
    const last = await mechanic.post(`${jobUrl}/${second.body.id as string}/labour`).set(csrf).send({ userId: mechanicId, workedOn: '2026-01-16', minutes: 20, description: 'Lights' });
    expect(last.status).toBe(201);

    const res = await costs();
    expect(res.status).toBe(200);
    expect(res.body.jobs).toEqual([
      expect.objectContaining({ jobId: first.body.id, partsMinor: 500, labourMinor: 9000, totalMinor: 9500 }),
      expect.objectContaining({ jobId: second.body.id, partsMinor: 0, labourMinor: 2000, totalMinor: 2000 }),
    ]);
    // Worked by hand: 1,800.00 + 95.00 + 20.00 = 1,915.00; 2,500.00 − 1,915.00 = 585.00 = 23.4 % of the asking price.
    expect(res.body).toMatchObject({ jobsMinor: 11_500, totalCostMinor: 191_500, marginMinor: 58_500, marginPercent: 23.4 });
    // The same figure as the job page shows.
    expect((await owner.get(`${jobUrl}/${first.body.id as string}`)).body.cost.totalMinor).toBe(9500);
  });

  it('gives no margin without an asking price, and none for a customer’s vehicle', async () => {
    const noPrice = await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Velmark', model: 'Plover', year: 1972, acquisitionCostMinor: 90_000 });
    expect(noPrice.status, JSON.stringify(noPrice.body)).toBe(201);
    const res = await owner.get(`/api/shops/${shopId}/vehicles/${noPrice.body.id as string}/costs`);
    expect(res.body).toMatchObject({ totalCostMinor: 90_000, marginMinor: null, marginPercent: null });
  });

  it('is hidden from a mechanic (403) but read by a viewer, and 404 to another shop', async () => {
    const vehicle = await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Corran', model: 'Tern 500', acquisitionCostMinor: 100_000, askingPriceMinor: 150_000 });
    const path = `/api/shops/${shopId}/vehicles/${vehicle.body.id as string}/costs`;
    const refused = await mechanic.get(path);
    expect(refused.status).toBe(403);
    expect(JSON.stringify(refused.body)).not.toContain('150000');
    expect((await viewer.get(path)).status).toBe(200);
    // Nor does the vehicle itself tell a mechanic what it cost; the owner and a viewer see it.
    const one = `/api/shops/${shopId}/vehicles/${vehicle.body.id as string}`;
    expect((await mechanic.get(one)).body.acquisitionCostMinor).toBeNull();
    expect((await mechanic.get(`/api/shops/${shopId}/vehicles`)).body.items.every((v: { acquisitionCostMinor: number | null }) => v.acquisitionCostMinor === null)).toBe(true);
    expect((await owner.get(one)).body.acquisitionCostMinor).toBe(100_000);
    expect((await viewer.get(one)).body.acquisitionCostMinor).toBe(100_000);
    expect((await outsider.get(path)).status).toBe(404);
    expect((await owner.get(`/api/shops/${shopId}/vehicles/00000000-0000-4000-8000-000000000000/costs`)).status).toBe(404);
  });
});
