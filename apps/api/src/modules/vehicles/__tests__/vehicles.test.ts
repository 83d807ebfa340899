import fc from 'fast-check';
import request from 'supertest';
import { validate as independentVinValidate } from 'vin-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { convert } from '@tappet/domain';
import { AuditEventEntity } from '../../audit/audit.entity';
import { FitmentEntity, PartEntity } from '../../catalogue/catalogue.entity';
import { CustomerEntity } from '../../customers/customers.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createBin, holdStock, receiveStock } from '../../stock/stock.service';
import { VehicleEntity, VehicleStatusChangeEntity } from '../vehicles.entity';
import { decideVin, odometerIn } from '../vehicles.service';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let otherShopId: string;
let owner: Agent;
let mechanic: Agent;
let viewer: Agent;
let buyer: Agent;
let outsider: Agent;
let ownerId: string;
let otherCustomerId: string;
let otherVehicleId: string;

const base = () => `/api/shops/${shopId}`;
const auditCount = (action: string, entityId?: string) => ctx.db.reader.count(AuditEventEntity, { where: { action, ...(entityId ? { entityId } : {}) } });

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  otherShopId = other.shop.id;
  ownerId = shop.byRole.owner.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  const c = await outsider.post(`/api/shops/${otherShopId}/customers`).set(csrf).send({ name: 'Other Shop Customer' });
  otherCustomerId = c.body.id;
  const v = await outsider.post(`/api/shops/${otherShopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Velmark', model: 'Other', customerId: otherCustomerId });
  otherVehicleId = v.body.id;
});
afterAll(() => ctx.close());

describe('vehicle records', () => {
  it('creates a vehicle with a customer and an arrival reading; it arrives with one status change and audit events', async () => {
    const customer = await owner.post(`${base()}/customers`).set(csrf).send({ name: 'Edna Marlowe', email: 'Edna@Example.test', phone: '+44 1632 960 123' });
    expect(customer.status).toBe(201);
    expect(customer.body.email).toBe('edna@example.test');
    const res = await mechanic
      .post(`${base()}/vehicles`)
      .set(csrf)
      .send({ kind: 'customer', marque: 'Corran', model: 'Meadowlark 350', year: 1966, frameNumber: 'CM 41207', engineNumber: 'CME 41207', condition: 'runs_needs_work', customerId: customer.body.id, odometer: { value: 23110, unit: 'mi', readOn: '2026-01-14' } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ status: 'arrived', customer: { id: customer.body.id, name: 'Edna Marlowe' }, vinCheck: 'not_checked', latestOdometer: { value: 23110, unit: 'mi', readOn: '2026-01-14' } });
    expect(res.body.statusHistory).toHaveLength(1);
    expect(res.body.nextStatuses).toEqual(['assessing', 'in_work', 'handed_over']);
    expect(await auditCount('vehicle.created', res.body.id)).toBe(1);
    expect(await auditCount('vehicle.odometer_recorded', res.body.id)).toBe(1);
  });

  it('refuses unknown fields and bad values with messages', async () => {
    const extra = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'X', shopId: otherShopId });
    expect(extra.status).toBe(400);
    const badKind = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'loan', marque: 'Corran', model: 'X' });
    expect(badKind.status).toBe(400);
    expect(badKind.body.error.message).toMatch(/customer, shop_stock or consignment/);
  });

  it('keeps money for shop stock only: acquisition cost is refused on a customer vehicle', async () => {
    const res = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'X', acquisitionCostMinor: 1000 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/shop stock only/);
  });

  it('lists with filters by kind, status and marque, and offers every marque', async () => {
    await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Astley-Pike', model: 'Sprint 500', year: 1971, acquisitionCostMinor: 180000, askingPriceMinor: 420000 });
    const all = await viewer.get(`${base()}/vehicles`);
    expect(all.status).toBe(200);
    expect(all.body.marques).toEqual(expect.arrayContaining(['Astley-Pike', 'Corran']));
    const stock = await viewer.get(`${base()}/vehicles?kind=shop_stock`);
    expect(stock.body.items.every((v: { kind: string }) => v.kind === 'shop_stock')).toBe(true);
    expect(stock.body.items.length).toBeGreaterThan(0);
    const byMarque = await viewer.get(`${base()}/vehicles?marque=astley-pike`);
    expect(byMarque.body.items.map((v: { marque: string }) => v.marque)).toEqual(['Astley-Pike']);
    const none = await viewer.get(`${base()}/vehicles?status=sold`);
    expect(none.body.total).toBe(0);
    expect((await viewer.get(`${base()}/vehicles?status=parked`)).status).toBe(400);
  });
});

describe('VIN checks', () => {
  const create = (agent: Agent, body: Record<string, unknown>) => agent.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Velmark', model: 'Tourer', ...body });

  it('accepts the worked example of 49 CFR 565 (1G4AH59H45G118341, check digit 4)', async () => {
    // Source: US 49 CFR 565 check-digit calculation example (weighted sum 411, remainder 4).
    const res = await create(owner, { vin: '1g4ah59h45g118341' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ vin: '1G4AH59H45G118341', vinCheck: 'passed' });
  });

  it('accepts a VIN whose check digit is X (1M8GDM9AXKP042788)', async () => {
    // Source: a published valid VIN with check digit X (remainder 10), listed with 49 CFR 565 in
    // /work/shared/check-values.md; vin-validator agrees.
    expect(independentVinValidate('1M8GDM9AXKP042788')).toBe(true);
    const res = await create(owner, { vin: '1M8GDM9AXKP042788' });
    expect(res.status).toBe(201);
    expect(res.body.vinCheck).toBe('passed');
  });

  it('warns on a failing check digit, creates nothing, and keeps the VIN only when the warning is confirmed', async () => {
    const before = await ctx.db.reader.count(VehicleEntity, { where: { shopId } });
    const warned = await create(mechanic, { vin: '1G4AH59H55G118341' });
    expect(warned.status).toBe(400);
    expect(warned.body.error.message).toMatch(/check digit/);
    expect(warned.body.error.message).toMatch(/North America/);
    expect(warned.body.error.details[0]).toMatchObject({ path: ['vin'], warning: 'vin_check_digit', expected: '4' });
    expect(await ctx.db.reader.count(VehicleEntity, { where: { shopId } })).toBe(before);

    const confirmed = await create(mechanic, { vin: '1G4AH59H55G118341', acknowledgeCheckDigit: true });
    expect(confirmed.status).toBe(201);
    expect(confirmed.body.vinCheck).toBe('acknowledged_failure');
    const audit = await ctx.db.reader.findOneOrFail(AuditEventEntity, { where: { action: 'vehicle.created', entityId: confirmed.body.id } });
    expect(audit.changes['vinCheckAcknowledged']).toEqual({ before: null, after: true });

    // Changing to another failing VIN needs a new confirmation.
    const patched = await mechanic.patch(`${base()}/vehicles/${confirmed.body.id}`).set(csrf).send({ vin: '1G4AH59H65G118341' });
    expect(patched.status).toBe(400);
    expect(patched.body.error.details[0].warning).toBe('vin_check_digit');
    // Correcting it clears the acknowledgement.
    const fixed = await mechanic.patch(`${base()}/vehicles/${confirmed.body.id}`).set(csrf).send({ vin: '1G4AH59H45G118341' });
    expect(fixed.status).toBe(200);
    expect(fixed.body.vinCheck).toBe('passed');
  });

  it('refuses I, O and Q in the VIN field, even with the warning confirmed', async () => {
    for (const vin of ['1G4AH59H45G11834I', '1G4AH59H4OG118341', '1G4AH59H45G11834Q']) {
      const res = await create(owner, { vin, acknowledgeCheckDigit: true });
      expect(res.status, vin).toBe(400);
      expect(res.body.error.message).toMatch(/I, O or Q/);
    }
  });

  it('does not check identifiers shorter than 17 characters (vehicles before 1981)', async () => {
    const res = await create(owner, { vin: 'VM4412' });
    expect(res.status).toBe(201);
    expect(res.body.vinCheck).toBe('not_checked');
  });

  it('property: the API refuses exactly the 17-character VINs that vin-validator refuses', () => {
    // Independent library: vin-validator (validate(vin) → boolean). Random strings over the VIN
    // alphabet: about one in eleven carries a valid check digit.
    const vinChar = fc.constantFrom(...'0123456789ABCDEFGHJKLMNPRSTUVWXYZ');
    fc.assert(
      fc.property(fc.array(vinChar, { minLength: 17, maxLength: 17 }), (chars) => {
        const vin = chars.join('');
        let refused = false;
        try {
          decideVin(vin, false);
        } catch {
          refused = true;
        }
        expect(refused).toBe(!independentVinValidate(vin));
        // Confirmed, every such VIN is kept.
        expect(decideVin(vin, true).acknowledged).toBe(refused);
      }),
      { numRuns: 1000 },
    );
  });
});

describe('odometer readings', () => {
  it('converts between miles and kilometres exactly as NIST SP 811 defines the mile', () => {
    // Source: NIST SP 811 (2008), appendix B.8: 1 mile (international) = 1.609344 km exactly.
    expect(convert(1, 'mi', 'km')).toBe(1.609344);
    expect(odometerIn({ value: 1, unit: 'mi' }, 'km')).toBeCloseTo(1.609344, 12);
    expect(odometerIn({ value: 10_000, unit: 'mi' }, 'km')).toBeCloseTo(16_093.44, 9);
    // The reverse: 1 km = 1 / 1.609344 mi = 0.621371192237334 mi.
    expect(odometerIn({ value: 1, unit: 'km' }, 'mi')).toBeCloseTo(0.621371192237334, 12);
    expect(odometerIn({ value: 42_195, unit: 'km' }, 'km')).toBe(42_195);
  });

  it('records a reading in its own unit, refuses a future date, and shows the latest', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Reading' });
    const first = await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 4100, unit: 'km', readOn: '2025-11-02' });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ value: 4100, unit: 'km', recordedBy: { name: expect.any(String) } });
    const future = await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 4200, unit: 'km', readOn: '2027-01-01' });
    expect(future.status).toBe(400);
    // Today counts, whatever the hour (the fake clock says 09:00 UTC on 15 January).
    expect((await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 4150, unit: 'km', readOn: '2026-01-15' })).status).toBe(201);
    expect((await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 4150, unit: 'km', readOn: '2026-01-17' })).status).toBe(400);
    const miles = await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 2600, unit: 'mi', readOn: '2026-01-12', note: 'After clock swap' });
    expect(miles.status).toBe(201);
    const detail = await viewer.get(`${base()}/vehicles/${v.body.id}`);
    expect(detail.body.latestOdometer).toMatchObject({ value: 4150, unit: 'km', readOn: '2026-01-15' });
    expect(detail.body.odometerReadings).toHaveLength(3);
    expect((await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: -1, unit: 'mi', readOn: '2026-01-12' })).status).toBe(400);
    expect((await mechanic.post(`${base()}/vehicles/${v.body.id}/odometer-readings`).set(csrf).send({ value: 10, unit: 'miles', readOn: '2026-01-12' })).status).toBe(400);
  });
});

describe('status through the shop', () => {
  it('records an arrival dated today at the time it is recorded, never later than now', async () => {
    const res = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Today', arrivedOn: '2026-01-15', odometer: { value: 10, unit: 'mi', readOn: '2026-01-15' } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.statusSince).toBe(ctx.clock.now().toISOString());
    expect((await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Later', arrivedOn: '2026-02-01' })).status).toBe(400);
  });

  it('moves a customer vehicle arrived → assessing → in work → ready → handed over, each move audited and on the timeline', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Mover', arrivedOn: '2026-01-05' });
    const id = v.body.id as string;
    const moves: Array<[string, string]> = [
      ['assessing', '2026-01-06T09:00:00Z'],
      ['in_work', '2026-01-08T10:30:00Z'],
      ['ready', '2026-01-14T16:00:00Z'],
      ['handed_over', '2026-01-15T08:00:00Z'],
    ];
    for (const [to, at] of moves) {
      const res = await mechanic.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to, at });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.status).toBe(to);
      expect(res.body.statusSince).toBe(new Date(at).toISOString());
    }
    expect(await auditCount('vehicle.status_changed', id)).toBe(4);
    const history = await ctx.db.reader.find(VehicleStatusChangeEntity, { where: { vehicleId: id }, order: { changedAt: 'ASC' } });
    expect(history.map((h) => h.toStatus)).toEqual(['arrived', 'assessing', 'in_work', 'ready', 'handed_over']);
    const timeline = await viewer.get(`${base()}/vehicles/${id}/timeline`);
    expect(timeline.status).toBe(200);
    const statusTitles = timeline.body.entries.filter((e: { kind: string }) => e.kind === 'status').map((e: { title: string }) => e.title);
    expect(statusTitles).toEqual(['Ready → Handed over', 'In work → Ready', 'Being assessed → In work', 'Arrived → Being assessed', 'Arrived']);
  });

  it('refuses a move the status does not allow, a sale of a customer vehicle, a future or out-of-order date', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Stuck', arrivedOn: '2026-01-10' });
    const id = v.body.id as string;
    const toReady = await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'ready' });
    expect(toReady.status).toBe(409);
    expect(toReady.body.error.message).toMatch(/cannot move to “Ready”/);
    await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'assessing' });
    await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'ready' });
    const sold = await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'sold' });
    expect(sold.status).toBe(409);
    const future = await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'handed_over', at: '2026-02-01T00:00:00Z' });
    expect(future.status).toBe(400);
    const early = await owner.post(`${base()}/vehicles/${id}/status`).set(csrf).send({ to: 'handed_over', at: '2026-01-09T00:00:00Z' });
    expect(early.status).toBe(400);
    expect((await owner.get(`${base()}/vehicles/${id}`)).body.status).toBe('ready');
  });

  it('sells shop stock from ready; a sold vehicle moves no further', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Velmark', model: 'Sold', askingPriceMinor: 500000 });
    for (const to of ['in_work', 'ready', 'sold']) expect((await owner.post(`${base()}/vehicles/${v.body.id}/status`).set(csrf).send({ to })).status).toBe(200);
    const detail = await owner.get(`${base()}/vehicles/${v.body.id}`);
    expect(detail.body.nextStatuses).toEqual([]);
    expect((await owner.post(`${base()}/vehicles/${v.body.id}/status`).set(csrf).send({ to: 'arrived' })).status).toBe(409);
  });
});

describe('numbers matching', () => {
  it('records whether the numbers match the documents, with who checked and when', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Numbers', frameNumber: 'CM 5501', engineNumber: 'CME 5501' });
    const res = await mechanic.post(`${base()}/vehicles/${v.body.id}/numbers-check`).set(csrf).send({ matching: true, note: 'Checked against the old registration book' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ numbersMatching: true, numbersCheckedBy: { name: expect.any(String) }, numbersCheckedAt: ctx.clock.now().toISOString(), numbersNote: 'Checked against the old registration book' });
    expect(await auditCount('vehicle.numbers_checked', v.body.id)).toBe(1);
    const again = await mechanic.post(`${base()}/vehicles/${v.body.id}/numbers-check`).set(csrf).send({ matching: false });
    expect(again.body.numbersMatching).toBe(false);
    const audit = await ctx.db.reader.find(AuditEventEntity, { where: { action: 'vehicle.numbers_checked', entityId: v.body.id }, order: { createdAt: 'ASC' } });
    expect(audit.at(-1)?.changes['numbersMatching']).toEqual({ before: true, after: false });
  });
});

describe('roles', () => {
  let stockId: string;
  beforeAll(async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Astley-Pike', model: 'Money', acquisitionCostMinor: 150000, askingPriceMinor: 390000 });
    stockId = v.body.id;
  });

  it('a viewer reads vehicles, customers, timeline and fitment but changes nothing', async () => {
    expect((await viewer.get(`${base()}/vehicles/${stockId}`)).status).toBe(200);
    expect((await viewer.get(`${base()}/vehicles/${stockId}/timeline`)).status).toBe(200);
    expect((await viewer.get(`${base()}/vehicles/${stockId}/fitment`)).status).toBe(200);
    expect((await viewer.get(`${base()}/customers`)).status).toBe(200);
    expect((await viewer.patch(`${base()}/vehicles/${stockId}`).set(csrf).send({ notes: 'viewer' })).status).toBe(403);
    expect((await viewer.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'A', model: 'B' })).status).toBe(403);
    expect((await buyer.post(`${base()}/vehicles/${stockId}/status`).set(csrf).send({ to: 'in_work' })).status).toBe(403);
  });

  it('a mechanic cannot change the acquisition cost or asking price: 403, nothing changed, nothing audited', async () => {
    const auditBefore = await auditCount('vehicle.updated', stockId);
    for (const patch of [{ askingPriceMinor: 1 }, { acquisitionCostMinor: 1 }, { askingPriceMinor: 1, notes: 'and a note' }, { askingPriceMinor: null }]) {
      const res = await mechanic.patch(`${base()}/vehicles/${stockId}`).set(csrf).send(patch);
      expect(res.status, JSON.stringify(patch)).toBe(403);
      expect(res.body.error.message).toMatch(/acquisition cost|asking price/);
    }
    const row = await ctx.db.reader.findOneByOrFail(VehicleEntity, { id: stockId });
    expect(row).toMatchObject({ acquisitionCostMinor: 150000, askingPriceMinor: 390000, notes: null });
    expect(await auditCount('vehicle.updated', stockId)).toBe(auditBefore);
    // Sending the same value back is not a change (a form that sends every field still works).
    expect((await mechanic.patch(`${base()}/vehicles/${stockId}`).set(csrf).send({ askingPriceMinor: 390000, colour: 'Heron grey' })).status).toBe(200);
    // A mechanic cannot create shop stock with money either.
    const count = await ctx.db.reader.count(VehicleEntity, { where: { shopId } });
    expect((await mechanic.post(`${base()}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'A', model: 'B', askingPriceMinor: 100 })).status).toBe(403);
    expect(await ctx.db.reader.count(VehicleEntity, { where: { shopId } })).toBe(count);
    // The owner may.
    const ok = await owner.patch(`${base()}/vehicles/${stockId}`).set(csrf).send({ askingPriceMinor: 375000 });
    expect(ok.status).toBe(200);
    expect(ok.body.askingPriceMinor).toBe(375000);
  });

  it('customers are kept by the owner; a mechanic reads them', async () => {
    expect((await mechanic.get(`${base()}/customers`)).status).toBe(200);
    expect((await mechanic.post(`${base()}/customers`).set(csrf).send({ name: 'Someone' })).status).toBe(403);
  });
});

describe('tenant isolation', () => {
  it('another shop’s vehicle by id is 404 on every vehicle route', async () => {
    const foreign = `${base()}/vehicles/${otherVehicleId}`;
    expect((await owner.get(foreign)).status).toBe(404);
    expect((await owner.patch(foreign).set(csrf).send({ notes: 'x' })).status).toBe(404);
    expect((await owner.post(`${foreign}/status`).set(csrf).send({ to: 'assessing' })).status).toBe(404);
    expect((await owner.post(`${foreign}/odometer-readings`).set(csrf).send({ value: 1, unit: 'mi', readOn: '2026-01-01' })).status).toBe(404);
    expect((await owner.post(`${foreign}/numbers-check`).set(csrf).send({ matching: true })).status).toBe(404);
    expect((await owner.get(`${foreign}/timeline`)).status).toBe(404);
    expect((await owner.get(`${foreign}/fitment`)).status).toBe(404);
    const row = await ctx.db.reader.findOneByOrFail(VehicleEntity, { id: otherVehicleId });
    expect(row.status).toBe('arrived');
    expect(row.notes).toBeNull();
  });

  it('another shop’s customer id inside a body is 404 and nothing is created or changed', async () => {
    const before = await ctx.db.reader.count(VehicleEntity, { where: { shopId } });
    const res = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Foreign', customerId: otherCustomerId });
    expect(res.status).toBe(404);
    expect(await ctx.db.reader.count(VehicleEntity, { where: { shopId } })).toBe(before);
    const mine = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Mine' });
    const patch = await owner.patch(`${base()}/vehicles/${mine.body.id}`).set(csrf).send({ customerId: otherCustomerId });
    expect(patch.status).toBe(404);
    expect((await ctx.db.reader.findOneByOrFail(VehicleEntity, { id: mine.body.id })).customerId).toBeNull();
    expect((await owner.get(`${base()}/customers/${otherCustomerId}`)).status).toBe(404);
    expect((await owner.patch(`${base()}/customers/${otherCustomerId}`).set(csrf).send({ name: 'Renamed' })).status).toBe(404);
    expect((await ctx.db.reader.findOneByOrFail(CustomerEntity, { id: otherCustomerId })).name).toBe('Other Shop Customer');
  });

  it('the database itself refuses a vehicle pointing at another shop’s customer', async () => {
    const mine = await owner.post(`${base()}/customers`).set(csrf).send({ name: 'Local Customer' });
    expect(mine.status).toBe(201);
    // The composite key (shop_id, customer_id) has no match in the other shop.
    await expect(ctx.db.write((m) => m.update(VehicleEntity, { id: otherVehicleId }, { customerId: mine.body.id }))).rejects.toThrow(/foreign key/i);
  });

  it('a non-member sees 404 for the shop’s vehicle list', async () => {
    expect((await outsider.get(`${base()}/vehicles`)).status).toBe(404);
    expect((await request(ctx.app).get(`${base()}/vehicles`)).status).toBe(401);
  });
});

describe('fitment', () => {
  it('lists parts whose fitment covers the vehicle by model, year and frame range, and says when the frame cannot be compared', async () => {
    const at = new Date();
    const part = (number: string) => ({ id: crypto.randomUUID(), shopId, number, key: number.replace(/[^A-Z0-9]/g, ''), description: `Part ${number}`, origin: 'genuine' as const, maker: null, category: null, unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at });
    const inRange = part('VF-100');
    const wrongYear = part('VF-200');
    const outOfFrames = part('VF-300');
    const otherSeries = part('VF-400');
    const otherModel = part('VF-500');
    const fit = (partId: string, f: Partial<{ model: string; yearFrom: number; yearTo: number; frameFrom: string; frameTo: string }>) => ({
      id: crypto.randomUUID(),
      shopId,
      partId,
      marque: 'Velmark',
      model: f.model ?? 'Fitter 250',
      yearFrom: f.yearFrom ?? null,
      yearTo: f.yearTo ?? null,
      frameFrom: f.frameFrom ?? null,
      frameTo: f.frameTo ?? null,
    });
    await ctx.db.write(async (m) => {
      await m.insert(PartEntity, [inRange, wrongYear, outOfFrames, otherSeries, otherModel]);
      await m.insert(FitmentEntity, [
        fit(inRange.id, { yearFrom: 1968, yearTo: 1972, frameFrom: 'VF 1000', frameTo: 'VF 2000' }),
        fit(wrongYear.id, { yearFrom: 1973, yearTo: 1975 }),
        fit(outOfFrames.id, { frameFrom: 'VF 3000' }),
        fit(otherSeries.id, { frameFrom: 'ZZ 1', frameTo: 'ZZ 9' }),
        fit(otherModel.id, { model: 'Other 500' }),
      ]);
    });
    await ctx.db.write(async (m) => {
      const stockCtx = { actor: { userId: ownerId }, at: new Date(Date.UTC(2026, 0, 14)) };
      const bin = await createBin(m, shopId, { code: 'F-1' }, stockCtx);
      await receiveStock(m, shopId, { partId: inRange.id, binId: bin.id, condition: 'new', quantity: 5, unitCostMinor: 1000 }, stockCtx);
      await holdStock(m, shopId, { partId: inRange.id, binId: bin.id, condition: 'new', quantity: 2, purpose: 'Another job' }, stockCtx);
    });
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'velmark', model: 'FITTER 250', year: 1970, frameNumber: 'VF-1500' });
    const res = await viewer.get(`${base()}/vehicles/${v.body.id}/fitment`);
    expect(res.status).toBe(200);
    expect(res.body.parts.map((p: { number: string; frameMatch: string }) => [p.number, p.frameMatch])).toEqual([
      ['VF-100', 'yes'],
      ['VF-400', 'unknown'],
    ]);
    // Free stock from the ledger: 5 received, 2 held → 3 free, in bin F-1.
    expect(res.body.stockKnown).toBe(true);
    expect(res.body.parts[0]).toMatchObject({ freeStock: 3, bins: ['F-1 (new)'] });
    expect(res.body.parts[1]).toMatchObject({ freeStock: 0, bins: [] });
  });
});

describe('audit', () => {
  it('records the owner as actor with the changed fields', async () => {
    const v = await owner.post(`${base()}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Audited' });
    await owner.patch(`${base()}/vehicles/${v.body.id}`).set(csrf).send({ colour: 'Harbour blue', year: 1969 });
    const event = await ctx.db.reader.findOneOrFail(AuditEventEntity, { where: { action: 'vehicle.updated', entityId: v.body.id } });
    expect(event.actorUserId).toBe(ownerId);
    expect(event.changes).toEqual({ colour: { before: null, after: 'Harbour blue' }, year: { before: null, after: 1969 } });
  });
});
