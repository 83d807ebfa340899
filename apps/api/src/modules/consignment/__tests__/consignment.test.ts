import type { Response } from 'superagent';
import request from 'supertest';
import { PDFDocument } from 'pdf-lib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';
import { seedVehicleFixture, type VehicleFixture } from '../../vehicles/vehicles.test-fixture';

// Consignment (issue 12): terms at intake, the settlement after the sale (computed by hand below),
// its PDF, the payout, and who may see and do what.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let owner: Agent;
let mechanic: Agent;
let viewer: Agent;
let outsider: Agent;
let mechanicId: string;
let vehicles: VehicleFixture;
let stock: StockFixture;
let vehicleId: string;
let ownerSignIn: { email: string; password: string };

const url = (path = '') => `/api/shops/${shopId}/consignment${path}`;
const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

/** A job on the consigned vehicle with an estimate of one typed line, approved through its link. */
async function approvedJob(title: string, netMinor: number): Promise<string> {
  const job = await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId, title, customerRequest: 'Consignor asked for it', assigneeIds: [mechanicId], templateIds: [] });
  expect(job.status, JSON.stringify(job.body)).toBe(201);
  const est = await owner.post(`/api/shops/${shopId}/estimates`).set(csrf).send({ jobId: job.body.id, lines: [{ kind: 'other', description: title, quantity: 1, unitPriceMinor: netMinor }] });
  expect(est.status, JSON.stringify(est.body)).toBe(201);
  expect((await owner.post(`/api/shops/${shopId}/estimates/${est.body.id}/send`).set(csrf).send({})).status).toBe(200);
  const token = /#([A-Za-z0-9_-]{43})/.exec(ctx.mailer.outbox.at(-1)!.text)![1];
  const ok = await request(ctx.app).post('/api/estimate-approval/approve').set(csrf).send({ token, version: 1, grossMinor: est.body.grossMinor, name: 'Consignor' });
  expect(ok.status, JSON.stringify(ok.body)).toBe(200);
  return job.body.id;
}

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  mechanicId = shop.byRole.mechanic.id;
  vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0);
  stock = await seedStockFixture(ctx.db, shopId, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  ownerSignIn = { email: shop.byRole.owner.email, password: shop.password };
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  const v = await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'consignment', marque: 'Harrow', model: 'Sprint 650', year: 1968, customerId: vehicles.customerId, askingPriceMinor: 1_300_000 });
  expect(v.status, JSON.stringify(v.body)).toBe(201);
  vehicleId = v.body.id;
}, 60_000);
afterAll(() => ctx.close());

describe('consignment settlement', () => {
  it('refuses terms on a vehicle that is not consigned, and settling before terms', async () => {
    const notConsigned = await owner.put(url(`/vehicles/${vehicles.vehicleId}/terms`)).set(csrf).send({ commissionKind: 'percent', commissionPercent: 10, agreedOn: '2026-01-10' });
    expect(notConsigned.status).toBe(409);
    const early = await owner.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1000, soldOn: '2026-01-20' });
    expect(early.status).toBe(409);
    expect(early.body.error.details.reason).toBe('no_terms');
    const missing = await owner.put(url(`/vehicles/${vehicleId}/terms`)).set(csrf).send({ commissionKind: 'percent', agreedOn: '2026-01-10' });
    expect(missing.status).toBe(400);
  });

  it('lets only the owner agree terms; mechanics see nothing; other shops get 404', async () => {
    const terms = { commissionKind: 'percent', commissionPercent: 12.5, agreedOn: '2026-01-10', note: 'Agreed at intake' };
    expect((await viewer.put(url(`/vehicles/${vehicleId}/terms`)).set(csrf).send(terms)).status).toBe(403);
    const ok = await owner.put(url(`/vehicles/${vehicleId}/terms`)).set(csrf).send(terms);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.terms).toMatchObject({ commissionKind: 'percent', commissionPercent: 12.5 });
    expect((await viewer.get(url(`/vehicles/${vehicleId}`))).status).toBe(200);
    expect((await mechanic.get(url(`/vehicles/${vehicleId}`))).status).toBe(403);
    expect((await outsider.get(`/api/shops/${shopId}/consignment/vehicles/${vehicleId}`)).status).toBe(404);
    const list = await owner.get(url('/vehicles'));
    expect(list.body.vehicles).toEqual([expect.objectContaining({ vehicleId, hasTerms: true, settlementReference: null, consignorName: 'Fixture Customer' })]);
  });

  it('settles a sale: commission, approved work at sell value capped at the approval, and the payout (worked by hand)', async () => {
    // Job A: approved 40 000 net + 20 % = 48 000 gross; the work done is 300 min of labour at
    //   £60.00/h = 30 000 net + 6 000 tax = 36 000 gross → charged 36 000 (below the approval).
    const jobA = await approvedJob('Recommission fuel system', 40_000);
    const labour = await mechanic.post(`/api/shops/${shopId}/jobs/${jobA}/labour`).set(csrf).send({ userId: mechanicId, workedOn: '2026-01-12', minutes: 300, description: 'Tank, tap and lines' });
    expect(labour.status, JSON.stringify(labour.body)).toBeLessThan(300);
    // Job B: approved 19 547 net + 3 909.4 → 3 909 tax = 23 456 gross; 100 parts issued at 350
    //   (cost 250 + 40 %) = 35 000 net + 7 000 = 42 000 gross → charged 23 456 (capped).
    const jobB = await approvedJob('New chains and sprockets', 19_547);
    const issued = await mechanic.post(`/api/shops/${shopId}/jobs/${jobB}/parts/issues`).set(csrf).send({ partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 100 });
    expect(issued.status, JSON.stringify(issued.body)).toBeLessThan(300);
    // A job without an approved estimate is not charged to the consignor.
    await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId, title: 'Shop’s own valet', customerRequest: '-', assigneeIds: [], templateIds: [] });

    const preview = await owner.get(url(`/vehicles/${vehicleId}`));
    expect(preview.body.work.map((w: { jobId: string; chargedMinor: number }) => [w.jobId, w.chargedMinor])).toEqual([
      [jobA, 36_000],
      [jobB, 23_456],
    ]);

    expect((await viewer.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1_234_500, soldOn: '2026-01-20' })).status).toBe(403);
    // Settling records the sale, so the vehicle must be one that can be sold: not while it has only arrived.
    const tooSoon = await owner.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1_234_500, soldOn: '2026-01-20' });
    expect(tooSoon.status).toBe(409);
    expect(tooSoon.body.error).toMatchObject({ details: { reason: 'not_ready_to_sell' } });
    expect(tooSoon.body.error.message).toContain('move it to “Ready” first');
    expect((await owner.get(url(`/vehicles/${vehicleId}`))).body).toMatchObject({ status: 'arrived', settlement: null });
    for (const to of ['assessing', 'ready']) expect((await owner.post(`/api/shops/${shopId}/vehicles/${vehicleId}/status`).set(csrf).send({ to })).status).toBe(200);
    // A sale dated before the vehicle was ready (the fake clock stands at 15 January) is refused.
    const backdated = await owner.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1_234_500, soldOn: '2026-01-14' });
    expect(backdated.status).toBe(400);
    expect(backdated.body.error.message).toBe('The sale date is before the vehicle became “Ready” (2026-01-15). Enter the day it was sold.');

    const settled = await owner.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1_234_500, soldOn: '2026-01-20', note: 'Sold to a private buyer' });
    expect(settled.status, JSON.stringify(settled.body)).toBe(201);
    // By hand: sale 1 234 500; commission 12.5 % = 154 312.5 → 154 313 (tie, away from zero: decision 015);
    //   work 36 000 + 23 456 = 59 456; payout 1 234 500 − 154 313 − 59 456 = 1 020 731.
    expect(settled.body.settlement).toMatchObject({ salePriceMinor: 1_234_500, commissionMinor: 154_313, workMinor: 59_456, payoutMinor: 1_020_731, consignorOwesMinor: 0, payout: null });
    expect(settled.body.settlement.reference).toMatch(/^CS-\d{6}$/);
    const audit = await ctx.db.reader.findOneByOrFail(AuditEventEntity, { entityId: settled.body.settlement.id, action: 'consignment.settled' });
    expect(audit.changes).toMatchObject({ payoutMinor: { after: 1_020_731 } });
    // …and the vehicle is sold, through its own status rules: a dated move with its audit event.
    expect(settled.body.status).toBe('sold');
    const sold = await owner.get(`/api/shops/${shopId}/vehicles/${vehicleId}`);
    expect(sold.body.status).toBe('sold');
    const moves = await ctx.db.reader.findBy(AuditEventEntity, { entityId: vehicleId, action: 'vehicle.status_changed' });
    expect(moves.map((m) => m.changes?.['status']?.after).sort()).toEqual(['assessing', 'ready', 'sold']);

    expect((await owner.post(url(`/vehicles/${vehicleId}/settlement`)).set(csrf).send({ salePriceMinor: 1, soldOn: '2026-01-20' })).status).toBe(409);
    expect((await owner.put(url(`/vehicles/${vehicleId}/terms`)).set(csrf).send({ commissionKind: 'fixed', commissionFixedMinor: 1, agreedOn: '2026-01-10' })).status).toBe(409);
  });

  it('prints the settlement as a PDF', async () => {
    const res = await viewer.get(url(`/vehicles/${vehicleId}/settlement/pdf`)).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = await PDFDocument.load(res.body as Buffer);
    expect(pdf.getTitle()).toMatch(/^Consignment settlement CS-\d{6}$/);
    expect(pdf.getPageCount()).toBe(1);
  });

  it('records the payout once', async () => {
    expect((await owner.post(url(`/vehicles/${vehicleId}/settlement/payout`)).set(csrf).send({ paidOn: '2026-01-22', method: 'wire', reference: 'x' })).status).toBe(400);
    const paid = await owner.post(url(`/vehicles/${vehicleId}/settlement/payout`)).set(csrf).send({ paidOn: '2026-01-22', method: 'bank_transfer', reference: 'HW-CS-1' });
    expect(paid.status, JSON.stringify(paid.body)).toBe(200);
    expect(paid.body.settlement.payout).toMatchObject({ paidOn: '2026-01-22', method: 'bank_transfer', reference: 'HW-CS-1' });
    const again = await owner.post(url(`/vehicles/${vehicleId}/settlement/payout`)).set(csrf).send({ paidOn: '2026-01-23', method: 'cash', reference: 'again' });
    expect(again.status).toBe(409);
    expect((await owner.get(url('/vehicles'))).body.vehicles[0]).toMatchObject({ paid: true, payoutMinor: 1_020_731 });
  });

  it('settles a vehicle already recorded as sold on its page for that sale: no later sale date, none before it was ready, no second move', async () => {
    const v = await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'consignment', marque: 'Harrow', model: 'Tourer 500', year: 1959, customerId: vehicles.customerId });
    expect(v.status, JSON.stringify(v.body)).toBe(201);
    const id = v.body.id as string;
    expect((await owner.put(url(`/vehicles/${id}/terms`)).set(csrf).send({ commissionKind: 'fixed', commissionFixedMinor: 50_000, agreedOn: '2026-01-15' })).status).toBe(200);
    // Five days on (a fresh sign-in: the old session has ended), the moves are dated on the days they happened.
    ctx.clock.advance(5 * 86_400_000);
    const later = await signedInAgent(ctx.app, ownerSignIn.email, ownerSignIn.password);
    for (const [to, at] of [['assessing', '2026-01-16T10:00:00.000Z'], ['ready', '2026-01-17T10:00:00.000Z'], ['sold', '2026-01-19T10:00:00.000Z']] as const) {
      const moved = await later.post(`/api/shops/${shopId}/vehicles/${id}/status`).set(csrf).send({ to, at });
      expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    }
    const form = await later.get(url(`/vehicles/${id}`));
    expect(form.body).toMatchObject({ status: 'sold', statusSince: '2026-01-19T10:00:00.000Z', settlement: null });

    const afterSale = await later.post(url(`/vehicles/${id}/settlement`)).set(csrf).send({ salePriceMinor: 800_000, soldOn: '2026-01-20' });
    expect(afterSale.status).toBe(400);
    expect(afterSale.body.error.message).toBe('This vehicle was recorded as sold on 2026-01-19: the sale date cannot be later than that.');
    const beforeReady = await later.post(url(`/vehicles/${id}/settlement`)).set(csrf).send({ salePriceMinor: 800_000, soldOn: '2026-01-16' });
    expect(beforeReady.status).toBe(400);
    expect(beforeReady.body.error.message).toBe('The sale date is before the vehicle became “Ready” (2026-01-17). Enter the day it was sold.');

    // Recorded sold a day after the sale: that is the usual order, and the sale stands as recorded.
    const settled = await later.post(url(`/vehicles/${id}/settlement`)).set(csrf).send({ salePriceMinor: 800_000, soldOn: '2026-01-18' });
    expect(settled.status, JSON.stringify(settled.body)).toBe(201);
    // By hand: 800 000 − 50 000 fixed commission − no approved work = 750 000.
    expect(settled.body.settlement).toMatchObject({ soldOn: '2026-01-18', commissionMinor: 50_000, workMinor: 0, payoutMinor: 750_000 });
    expect(settled.body).toMatchObject({ status: 'sold', statusSince: '2026-01-19T10:00:00.000Z' });
    const moves = await ctx.db.reader.findBy(AuditEventEntity, { entityId: id, action: 'vehicle.status_changed' });
    expect(moves.map((m) => m.changes?.['status']?.after).sort()).toEqual(['assessing', 'ready', 'sold']);
  });
});
