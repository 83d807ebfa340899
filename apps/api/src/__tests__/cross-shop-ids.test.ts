// Another shop's ids inside a request body (issue 13; OWASP API1:2023, ASVS 8.4.1). The owner of
// shop A sends a write to shop A's own URL with one id in the body swapped for shop B's: the
// answer is 404 and no table changes (every row of every table compared before and after). The
// same request with shop A's own id then succeeds, so each 404 is the foreign id's doing, not a
// mistyped route or a malformed body. (Ids in the URL: the authorisation matrix's outsider.)
import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../test-support/test-app';
import { databaseDigest } from '../test-support/database-digest';
import { seedCatalogueFixture } from '../modules/catalogue/catalogue.test-fixture';
import { seedStockFixture } from '../modules/stock/stock.test-fixture';
import { seedPurchasingFixture } from '../modules/purchasing/purchasing.test-fixture';
import { seedVehicleFixture } from '../modules/vehicles/vehicles.test-fixture';
import { seedJobsFixture } from '../modules/jobs/jobs.test-fixture';
import { seedEstimatesFixture } from '../modules/estimates/estimates.test-fixture';

/** The ids a body may carry, for one shop. */
interface Ids {
  shopId: string;
  /** A stocked part (1,000 in `bin`). */
  part: string;
  /** A catalogue part with no stock. */
  catalogPart: string;
  /** A part no supplier of the shop lists yet. */
  unlistedPart: string;
  bin: string;
  otherBin: string;
  supplier: string;
  /** A part the supplier lists, 1,000 of it in `supplierBin`. */
  supplierPart: string;
  supplierBin: string;
  sentOrder: string;
  sentLine: string;
  vehicle: string;
  customer: string;
  job: string;
  /** A job with no estimate yet. */
  freeJob: string;
  mechanic: string;
}

let ctx: TestContext;
let owner: TestAgent<Test>;
let own: Ids;
let foreign: Ids;

async function seedIds(): Promise<{ ids: Ids; ownerEmail: string; password: string }> {
  const shop = await seedShop(ctx, ['owner', 'mechanic']);
  const shopId = shop.shop.id;
  const catalogue = await seedCatalogueFixture(ctx.db, shopId, 2);
  const stock = await seedStockFixture(ctx.db, shopId, 1);
  const purchasing = await seedPurchasingFixture(ctx.db, shopId, 2);
  const vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 2);
  const jobs = await seedJobsFixture(ctx.db, shopId, ctx.env.uploadsDir, { vehicleId: vehicles.vehicleId, partId: stock.partId, binId: stock.binId, userId: shop.byRole.mechanic.id }, 2);
  const estimates = await seedEstimatesFixture(ctx.db, shopId, ctx.env.uploadsDir, vehicles.vehicleId, 2);
  const sentOrder = purchasing.nextSentId();
  const ids: Ids = {
    shopId,
    part: stock.partId,
    catalogPart: catalogue.partId,
    unlistedPart: purchasing.nextUnlistedPart().id,
    bin: stock.binId,
    otherBin: stock.otherBinId,
    supplier: purchasing.supplierId,
    supplierPart: purchasing.partId,
    supplierBin: purchasing.binId,
    sentOrder,
    sentLine: purchasing.nextSentLineId(sentOrder),
    vehicle: vehicles.vehicleId,
    customer: vehicles.customerId,
    job: jobs.jobId,
    freeJob: estimates.nextJobId(),
    mechanic: shop.byRole.mechanic.id,
  };
  return { ids, ownerEmail: shop.byRole.owner.email, password: shop.password };
}

beforeAll(async () => {
  ctx = await createTestContext();
  const a = await seedIds();
  own = a.ids;
  foreign = (await seedIds()).ids;
  owner = await signedInAgent(ctx.app, a.ownerEmail, a.password);
});
afterAll(() => ctx.close());

type Call = (a: TestAgent<Test>, ids: Ids) => Test;
const shop = (ids: Ids, rest: string) => `/api/shops/${ids.shopId}${rest}`;

/** Each write, the body ids to swap one at a time, and its status with the shop's own ids. */
const cases: Array<{ route: string; swap: Array<keyof Ids>; ok: number; call: Call }> = [
  { route: 'POST /stock/receipts', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, '/stock/receipts')).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantity: 1, unitCostMinor: 250 }) },
  { route: 'POST /stock/issues', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, '/stock/issues')).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantity: 1 }) },
  { route: 'POST /stock/adjustments', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, '/stock/adjustments')).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantityDelta: -1, reason: 'Cross-shop write-off' }) },
  { route: 'POST /stock/moves', swap: ['part', 'bin', 'otherBin'], ok: 201, call: (a, i) => a.post(shop(i, '/stock/moves')).set(csrf).send({ partId: i.part, condition: 'new', fromBinId: i.bin, toBinId: i.otherBin, quantity: 1 }) },
  { route: 'POST /stock/holds', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, '/stock/holds')).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantity: 1, purpose: 'Cross-shop hold' }) },
  { route: 'POST /part-links', swap: ['catalogPart'], ok: 201, call: (a, i) => a.post(shop(i, '/part-links')).set(csrf).send({ fromPartId: i.catalogPart, kind: 'replaced_by', toNumber: `XS-${Math.random().toString(36).slice(2, 8).toUpperCase()}` }) },
  { route: 'POST /fitments', swap: ['catalogPart'], ok: 201, call: (a, i) => a.post(shop(i, '/fitments')).set(csrf).send({ partId: i.catalogPart, marque: 'Crossholm', model: 'Test', yearFrom: 1970 }) },
  { route: 'POST /vehicles', swap: ['customer'], ok: 201, call: (a, i) => a.post(shop(i, '/vehicles')).set(csrf).send({ kind: 'customer', marque: 'Crossholm', model: 'Test', customerId: i.customer }) },
  { route: 'POST /jobs', swap: ['vehicle', 'mechanic'], ok: 201, call: (a, i) => a.post(shop(i, '/jobs')).set(csrf).send({ vehicleId: i.vehicle, title: 'Cross-shop job', customerRequest: 'Test', assigneeIds: [i.mechanic] }) },
  { route: 'POST /jobs/:jobId/parts/holds', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, `/jobs/${own.job}/parts/holds`)).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantity: 1 }) },
  { route: 'POST /jobs/:jobId/parts/issues', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, `/jobs/${own.job}/parts/issues`)).set(csrf).send({ partId: i.part, binId: i.bin, condition: 'new', quantity: 1 }) },
  { route: 'POST /jobs/:jobId/special-orders', swap: ['part'], ok: 201, call: (a, i) => a.post(shop(i, `/jobs/${own.job}/special-orders`)).set(csrf).send({ partId: i.part, quantity: 1 }) },
  { route: 'POST /jobs/:jobId/labour', swap: ['mechanic'], ok: 201, call: (a, i) => a.post(shop(i, `/jobs/${own.job}/labour`)).set(csrf).send({ userId: i.mechanic, workedOn: '2026-01-15', minutes: 15, description: 'Cross-shop labour' }) },
  { route: 'POST /estimates', swap: ['freeJob'], ok: 201, call: (a, i) => a.post(shop(i, '/estimates')).set(csrf).send({ jobId: i.freeJob, lines: [{ kind: 'labour', description: 'Cross-shop labour', quantity: 1 }] }) },
  { route: 'POST /purchasing/orders', swap: ['supplier', 'supplierPart'], ok: 201, call: (a, i) => a.post(shop(i, '/purchasing/orders')).set(csrf).send({ supplierId: i.supplier, lines: [{ partId: i.supplierPart, quantity: 1 }] }) },
  { route: 'POST /purchasing/suppliers/:supplierId/listings', swap: ['unlistedPart'], ok: 201, call: (a, i) => a.post(shop(i, `/purchasing/suppliers/${own.supplier}/listings`)).set(csrf).send({ partId: i.unlistedPart, priceMinor: 123 }) },
  { route: 'PUT /purchasing/parts/:partId', swap: ['supplier'], ok: 200, call: (a, i) => a.put(shop(i, `/purchasing/parts/${own.supplierPart}`)).set(csrf).send({ preferredSupplierId: i.supplier, minQty: 2, maxQty: null }) },
  { route: 'POST /purchasing/orders/:orderId/receipts', swap: ['sentLine', 'supplierBin'], ok: 200, call: (a, i) => a.post(shop(i, `/purchasing/orders/${own.sentOrder}/receipts`)).set(csrf).send({ lines: [{ lineId: i.sentLine, quantity: 1, binId: i.supplierBin }] }) },
  { route: 'POST /purchasing/returns', swap: ['supplier', 'supplierPart', 'supplierBin'], ok: 201, call: (a, i) => a.post(shop(i, '/purchasing/returns')).set(csrf).send({ supplierId: i.supplier, partId: i.supplierPart, binId: i.supplierBin, quantity: 1, reason: 'Cross-shop return', expectedCreditMinor: 1000 }) },
  { route: 'POST /sales/counter-sales', swap: ['part', 'bin'], ok: 201, call: (a, i) => a.post(shop(i, '/sales/counter-sales')).set(csrf).send({ lines: [{ partId: i.part, binId: i.bin, condition: 'new', quantity: 1, unitPriceMinor: 500 }] }) },
  // Last: a count of the other bin stops stock moving in it.
  { route: 'POST /counts', swap: ['otherBin'], ok: 201, call: (a, i) => a.post(shop(i, '/counts')).set(csrf).send({ binIds: [i.otherBin], note: 'Cross-shop count' }) },
];

describe('another shop’s id inside a body', () => {
  for (const c of cases) {
    it(`${c.route}: each of ${c.swap.join(', ')} from another shop is a 404 and changes nothing; its own ids succeed`, async () => {
      for (const key of c.swap) {
        const before = await databaseDigest(ctx.db);
        const res = await c.call(owner, { ...own, [key]: foreign[key] });
        expect(res.status, `${key}: ${JSON.stringify(res.body)}`).toBe(404);
        expect(res.body.error).toMatchObject({ code: 'not_found' });
        expect(await databaseDigest(ctx.db), key).toEqual(before);
      }
      const control = await c.call(owner, own);
      expect(control.status, JSON.stringify(control.body)).toBe(c.ok);
    });
  }
});
