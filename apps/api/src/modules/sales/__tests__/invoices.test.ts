/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are read loosely here and checked by value. */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedVehicleFixture, type VehicleFixture } from '../../vehicles/vehicles.test-fixture';
import { VehicleEntity } from '../../vehicles/vehicles.entity';
import { seedSalesFixture, type SalesFixture } from '../sales.test-fixture';

// Sales through the API against real SQLite: sell prices, totals and tax rounding (amounts worked
// by hand in the comments, rounding half away from zero as decision 015 says), gap-free numbers
// under concurrent issue, credit notes, payments, counter sales, job and vehicle invoices, roles.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let otherShopId: string;
let owner: Agent;
let mechanic: Agent;
let buyer: Agent;
let viewer: Agent;
let outsider: Agent;
let mechanicId: string;
let parts: SalesFixture;
let vehicles: VehicleFixture;

const url = (path: string, shop = shopId) => `/api/shops/${shop}/sales${path}`;

async function expectStatus<T = Record<string, unknown>>(p: PromiseLike<{ status: number; body: unknown }>, status: number): Promise<T> {
  const res = await p;
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body as T;
}

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  otherShopId = other.shop.id;
  mechanicId = shop.byRole.mechanic.id;
  parts = await seedSalesFixture(ctx.db, shopId);
  vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  await expectStatus(
    owner
      .put(url('/settings'))
      .set(csrf)
      .send({
        pricingRules: { useListPrice: true, defaultMarkupPercent: 40, categoryMarkups: { brakes: 50 }, originMarkups: { reproduction: 25 }, rounding: 'up-to-5' },
        extraTaxRates: [{ name: 'Reduced', ratePercent: 5 }],
      }),
    200,
  );
}, 60_000);
afterAll(() => ctx.close());

describe('sell prices', () => {
  it('follows the rules: list price, category, origin, default markup, rounding up to 5', async () => {
    await expectStatus(owner.put(url(`/parts/${parts.plainPartId}/list-price`)).set(csrf).send({ listPriceMinor: null }), 200);
    const ids = [parts.plainPartId, parts.brakePartId, parts.reproPartId, parts.unpricedPartId];
    const body = await expectStatus<{ prices: Array<{ partId: string; unitMinor: number | null; basis: string; unitCostMinor?: number | null }> }>(owner.get(url('/sell-prices')).query({ partIds: ids }), 200);
    const byId = new Map(body.prices.map((p) => [p.partId, p]));
    // 3.33 + 40 % = 4.662 → 4.66 → up to 4.70.
    expect(byId.get(parts.plainPartId)).toMatchObject({ unitMinor: 470, basis: 'default-markup', unitCostMinor: 333 });
    // 12.34 + 50 % (category "Brakes", matched case-insensitively) = 18.51 → 18.55.
    expect(byId.get(parts.brakePartId)).toMatchObject({ unitMinor: 1855, basis: 'category-markup' });
    // 10.00 + 25 % (reproduction) = 12.50, already a multiple of 5.
    expect(byId.get(parts.reproPartId)).toMatchObject({ unitMinor: 1250, basis: 'origin-markup' });
    expect(byId.get(parts.unpricedPartId)).toMatchObject({ unitMinor: null, basis: 'no-price' });
  });

  it('uses a list price when the part has one, and shows a mechanic no cost or margin', async () => {
    const set = await expectStatus<{ prices: Array<{ unitMinor: number; basis: string }> }>(owner.put(url(`/parts/${parts.unpricedPartId}/list-price`)).set(csrf).send({ listPriceMinor: 1999 }), 200);
    expect(set.prices[0]).toMatchObject({ unitMinor: 1999, basis: 'list' });
    const seen = await expectStatus<{ prices: Array<Record<string, unknown>> }>(mechanic.get(url('/sell-prices')).query({ partIds: parts.brakePartId }), 200);
    expect(seen.prices[0]).toMatchObject({ unitMinor: 1855 });
    expect(seen.prices[0]).not.toHaveProperty('unitCostMinor');
    expect(seen.prices[0]).not.toHaveProperty('marginMinor');
    const asBuyer = await expectStatus<{ prices: Array<Record<string, unknown>> }>(buyer.get(url('/sell-prices')).query({ partIds: parts.brakePartId }), 200);
    expect(asBuyer.prices[0]).toMatchObject({ unitCostMinor: 1234, marginMinor: 1855 - 1234 });
    await expectStatus(mechanic.put(url(`/parts/${parts.plainPartId}/list-price`)).set(csrf).send({ listPriceMinor: 100 }), 403);
    // Another shop's part is not found.
    await expectStatus(outsider.put(url(`/parts/${parts.plainPartId}/list-price`, otherShopId)).set(csrf).send({ listPriceMinor: 100 }), 404);
  });
});

/** The worked example: four kinds of line, two rates, a discount and three small lines whose tax rounds differently per line and per document. */
const workedLines = (unpricedPartId: string) => [
  // 2 × 19.99 (list price) less 10 % = 35.982 → 35.98; tax 20 % = 7.196 → 7.20.
  { kind: 'part', partId: unpricedPartId, description: 'Speedometer cable', quantity: '2', discountPercent: 10 },
  // Three lines of 1.12: tax 0.224 → 0.22 each per line (0.66); 3.36 × 20 % = 0.672 → 0.67 per document.
  { kind: 'other', description: 'Split pin pack', quantity: 1, unitPriceMinor: 112 },
  { kind: 'other', description: 'Washer pack', quantity: 1, unitPriceMinor: 112 },
  { kind: 'other', description: 'Clip pack', quantity: 1, unitPriceMinor: 112 },
  // 1.5 h × 60.00 = 90.00; tax 18.00.
  { kind: 'labour', description: 'Fit and adjust', quantity: '1.5', unitPriceMinor: 6000 },
  // 10.50 at the reduced 5 %: 0.525 → 0.53 (half away from zero).
  { kind: 'other', description: 'Workshop manual reprint', quantity: 1, unitPriceMinor: 1050, taxRatePercent: 5 },
];

describe('totals and tax rounding', () => {
  it('rounds tax per line by default (hand-computed)', async () => {
    const inv = await expectStatus<Record<string, any>>(owner.post(url('/invoices')).set(csrf).send({ customerName: 'Ada Fernleigh', lines: workedLines(parts.unpricedPartId) }), 201);
    expect(inv.taxRounding).toBe('per-line');
    expect(inv.lines.map((l: { netMinor: number; taxMinor: number }) => [l.netMinor, l.taxMinor])).toEqual([
      [3598, 720],
      [112, 22],
      [112, 22],
      [112, 22],
      [9000, 1800],
      [1050, 53],
    ]);
    // 20 %: 35.98 + 3.36 + 90.00 = 129.34 net, tax 7.20 + 0.66 + 18.00 = 25.86. 5 %: 10.50, tax 0.53.
    expect(inv.taxByRate).toEqual([
      { ratePercent: 20, netMinor: 12934, taxMinor: 2586 },
      { ratePercent: 5, netMinor: 1050, taxMinor: 53 },
    ]);
    expect(inv).toMatchObject({ netMinor: 13984, taxMinor: 2639, grossMinor: 16623, status: 'draft', number: null, paymentStatus: 'unpaid', dueMinor: 16623 });
  });

  it('rounds once per rate when the shop chooses per-document (hand-computed)', async () => {
    await expectStatus(owner.put(url('/settings')).set(csrf).send({ taxRounding: 'per-document' }), 200);
    try {
      const inv = await expectStatus<Record<string, any>>(owner.post(url('/invoices')).set(csrf).send({ customerName: 'Ada Fernleigh', lines: workedLines(parts.unpricedPartId) }), 201);
      // 129.34 × 20 % = 25.868 → 25.87; 10.50 × 5 % = 0.525 → 0.53.
      expect(inv.taxByRate).toEqual([
        { ratePercent: 20, netMinor: 12934, taxMinor: 2587 },
        { ratePercent: 5, netMinor: 1050, taxMinor: 53 },
      ]);
      expect(inv).toMatchObject({ netMinor: 13984, taxMinor: 2640, grossMinor: 16624, taxRounding: 'per-document' });
    } finally {
      await expectStatus(owner.put(url('/settings')).set(csrf).send({ taxRounding: 'per-line' }), 200);
    }
  });

  it('refuses a part line with no price to take, and bad input', async () => {
    const res = await owner.post(url('/invoices')).set(csrf).send({ customerName: 'X', lines: [{ kind: 'part', partId: randomUUID(), description: 'Nothing', quantity: 1 }] });
    expect(res.status).toBe(404);
    await expectStatus(owner.post(url('/invoices')).set(csrf).send({ customerName: 'X', lines: [{ kind: 'other', description: 'Odd', quantity: '1.23456', unitPriceMinor: 1 }] }), 400);
    await expectStatus(owner.post(url('/invoices')).set(csrf).send({ customerName: 'X', lines: [{ kind: 'other', description: 'Odd', quantity: 1, unitPriceMinor: 1.5 }] }), 400);
    await expectStatus(owner.post(url('/invoices')).set(csrf).send({ customerName: 'X', surprise: true }), 400);
  });
});

async function issuedInvoice(lines: object[], extra: object = {}): Promise<Record<string, any>> {
  const draft = await expectStatus<{ id: string }>(owner.post(url('/invoices')).set(csrf).send({ customerName: 'Bram Oakhurst', customerEmail: 'bram@oakhurst.test', lines, ...extra }), 201);
  return expectStatus<Record<string, any>>(owner.post(url(`/invoices/${draft.id}/issue`)).set(csrf).send({}), 200);
}

describe('issuing', () => {
  it('numbers without gaps when many issue at once, and a refused issue takes no number', async () => {
    const drafts: string[] = [];
    for (let i = 0; i < 20; i++) {
      drafts.push((await expectStatus<{ id: string }>(owner.post(url('/invoices')).set(csrf).send({ customerName: `Walk-in ${i}`, lines: [{ kind: 'other', description: 'Polish', quantity: 1, unitPriceMinor: 500 + i }] }), 201)).id);
    }
    const empty = (await expectStatus<{ id: string }>(owner.post(url('/invoices')).set(csrf).send({ customerName: 'Nobody', lines: [] }), 201)).id;
    const before = await expectStatus<{ invoices: Array<{ number: string | null }> }>(owner.get(url('/invoices')).query({ status: 'issued', kind: 'invoice', pageSize: 100 }), 200);
    const highest = Math.max(0, ...before.invoices.map((i) => Number(i.number!.slice(4))));
    const results = await Promise.all([...drafts, empty, drafts[0]!].map((id) => owner.post(url(`/invoices/${id}/issue`)).set(csrf).send({ sendEmail: false })));
    const ok = results.filter((r) => r.status === 200);
    expect(ok).toHaveLength(20);
    // The empty draft and the second issue of drafts[0] are refused.
    expect(results.filter((r) => r.status === 409)).toHaveLength(2);
    const numbers = ok.map((r) => Number((r.body.number as string).slice(4))).sort((a, b) => a - b);
    expect(numbers).toEqual(Array.from({ length: 20 }, (_, i) => highest + i + 1));
    const next = await issuedInvoice([{ kind: 'other', description: 'Next', quantity: 1, unitPriceMinor: 100 }]);
    expect(next.number).toBe(`INV-${String(highest + 21).padStart(5, '0')}`);
  });

  it('never edits or deletes an issued invoice, and e-mails its PDF with a pay link', async () => {
    ctx.mailer.outbox.length = 0;
    const inv = await issuedInvoice([{ kind: 'other', description: 'Carburettor balance', quantity: 1, unitPriceMinor: 4500 }]);
    expect(inv.emailed).toBe(true);
    const mail = ctx.mailer.outbox.find((m) => m.to === 'bram@oakhurst.test')!;
    expect(mail.subject).toContain(inv.number);
    expect(mail.attachments?.[0]?.contentType).toBe('application/pdf');
    expect(mail.attachments?.[0]?.content.subarray(0, 5).toString()).toBe('%PDF-');
    expect(mail.text).toMatch(/http:\/\/tappet\.test\/api\/pay\/[A-Za-z0-9_-]{20,}/);
    await expectStatus(owner.patch(url(`/invoices/${inv.id}`)).set(csrf).send({ notes: 'changed' }), 409);
    await expectStatus(owner.delete(url(`/invoices/${inv.id}`)).set(csrf), 409);
    const pdf = await owner.get(url(`/invoices/${inv.id}/pdf`));
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
  });
});

describe('credit notes', () => {
  it('credits by lines then the rest, in their own series, and reduces what is due', async () => {
    const inv = await issuedInvoice(workedLines(parts.unpricedPartId));
    const partLine = inv.lines[0];
    // 1 of the 2 cables: 19.99 less 10 % = 17.991 → 17.99; tax 3.598 → 3.60; 21.59.
    const cn = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${inv.id}/credit-notes`)).set(csrf).send({ lines: [{ lineId: partLine.id, quantity: '1' }], reason: 'One cable returned unused' }), 201);
    expect(cn).toMatchObject({ kind: 'credit_note', status: 'issued', creditedInvoiceId: inv.id, netMinor: 1799, taxMinor: 360, grossMinor: 2159 });
    expect(cn.number).toMatch(/^CN-\d{5}$/);
    const after = await expectStatus<Record<string, any>>(owner.get(url(`/invoices/${inv.id}`)), 200);
    expect(after).toMatchObject({ creditedMinor: 2159, dueMinor: 16623 - 2159, paymentStatus: 'unpaid' });
    expect(after.creditNotes).toEqual([{ id: cn.id, number: cn.number, grossMinor: 2159 }]);
    // Only one cable is left to credit.
    const over = await owner.post(url(`/invoices/${inv.id}/credit-notes`)).set(csrf).send({ lines: [{ lineId: partLine.id, quantity: '2' }], reason: 'Too many' });
    expect(over.status).toBe(409);
    expect(over.body.error.details.reason).toBe('credit_exceeds_line');
    const rest = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${inv.id}/credit-notes`)).set(csrf).send({ reason: 'Job cancelled' }), 201);
    expect(Number(rest.number.slice(3))).toBe(Number(cn.number.slice(3)) + 1);
    const final = await expectStatus<Record<string, any>>(owner.get(url(`/invoices/${inv.id}`)), 200);
    // Two partial credits of one line round separately, so the sum may differ from the invoice by the odd penny; nothing is due.
    expect(final.dueMinor).toBe(0);
    expect(final.paymentStatus).toBe('paid');
    await expectStatus(owner.post(url(`/invoices/${inv.id}/credit-notes`)).set(csrf).send({ reason: 'Again' }), 409);
    await expectStatus(owner.post(url(`/invoices/${cn.id}/credit-notes`)).set(csrf).send({ reason: 'Credit of a credit' }), 409);
  });
});

describe('payments', () => {
  it('takes a deposit, a cash part payment, then the rest by bank transfer, never more than is due', async () => {
    const draft = await expectStatus<{ id: string }>(owner.post(url('/invoices')).set(csrf).send({ customerName: 'Cora Pellow', lines: [{ kind: 'other', description: 'Respray', quantity: 1, unitPriceMinor: 50000 }] }), 201);
    // 500.00 + 20 % = 600.00. A 100.00 deposit on the draft.
    const deposit = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${draft.id}/payments`)).set(csrf).send({ method: 'bank_transfer', amountMinor: 10000, receivedOn: '2026-01-14', reference: 'DEP-1' }), 201);
    expect(deposit).toMatchObject({ paidMinor: 10000, dueMinor: 50000, paymentStatus: 'part_paid' });
    await expectStatus(owner.post(url(`/invoices/${draft.id}/issue`)).set(csrf).send({}), 200);
    const cash = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${draft.id}/payments`)).set(csrf).send({ method: 'cash', amountMinor: 20000, receivedOn: '2026-01-15' }), 201);
    expect(cash).toMatchObject({ paidMinor: 30000, dueMinor: 30000, paymentStatus: 'part_paid' });
    const tooMuch = await owner.post(url(`/invoices/${draft.id}/payments`)).set(csrf).send({ method: 'cash', amountMinor: 30001, receivedOn: '2026-01-15' });
    expect(tooMuch.status).toBe(409);
    expect(tooMuch.body.error.details).toMatchObject({ reason: 'more_than_due', dueMinor: 30000 });
    const rest = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${draft.id}/payments`)).set(csrf).send({ method: 'bank_transfer', amountMinor: 30000, receivedOn: '2026-01-16' }), 201);
    expect(rest).toMatchObject({ paidMinor: 60000, dueMinor: 0, paymentStatus: 'paid' });
    expect(rest.payments.map((p: { method: string; amountMinor: number }) => [p.method, p.amountMinor])).toEqual([
      ['bank_transfer', 10000],
      ['cash', 20000],
      ['bank_transfer', 30000],
    ]);
    const paid = await expectStatus<{ invoices: Array<{ id: string }> }>(owner.get(url('/invoices')).query({ status: 'paid', pageSize: 100 }), 200);
    expect(paid.invoices.map((i) => i.id)).toContain(draft.id);
    const unpaid = await expectStatus<{ invoices: Array<{ id: string }> }>(owner.get(url('/invoices')).query({ status: 'unpaid', pageSize: 100 }), 200);
    expect(unpaid.invoices.map((i) => i.id)).not.toContain(draft.id);
  });

  it('lets only the owner record payments', async () => {
    const inv = await issuedInvoice([{ kind: 'other', description: 'Valve clearances', quantity: 1, unitPriceMinor: 3000 }]);
    for (const agent of [buyer, mechanic, viewer]) {
      await expectStatus(agent.post(url(`/invoices/${inv.id}/payments`)).set(csrf).send({ method: 'cash', amountMinor: 100, receivedOn: '2026-01-15' }), 403);
      await expectStatus(agent.post(url(`/invoices/${inv.id}/issue`)).set(csrf).send({}), 403);
      await expectStatus(agent.post(url(`/invoices/${inv.id}/credit-notes`)).set(csrf).send({ reason: 'Not mine to do' }), 403);
      await expectStatus(agent.get(url(`/invoices/${inv.id}`)), 200);
    }
  });
});

describe('counter sales', () => {
  it('issues the stock and the invoice together, and refuses without taking a number when stock is short', async () => {
    ctx.mailer.outbox.length = 0;
    const sale = await expectStatus<Record<string, any>>(
      owner
        .post(url('/counter-sales'))
        .set(csrf)
        .send({ customerName: 'Dot Harrowgate', customerEmail: 'dot@harrowgate.test', lines: [{ partId: parts.brakePartId, binId: parts.binId, condition: 'new', quantity: 2 }] }),
      201,
    );
    // 2 × 18.55 = 37.10; tax 7.42; 44.52. Margin (owner sees it): 37.10 − 2 × 12.34 = 12.42.
    expect(sale).toMatchObject({ source: 'counter', status: 'issued', netMinor: 3710, taxMinor: 742, grossMinor: 4452, marginMinor: 1242, emailed: true });
    expect(sale.lines[0]).toMatchObject({ unitPriceMinor: 1855, unitCostMinor: 1234 });
    const stock = await owner.get(`/api/shops/${shopId}/stock`).query({ partId: parts.brakePartId });
    expect(stock.body.lines[0].onHand).toBe(8);
    const numberBefore = Number(sale.number.slice(4));
    const short = await owner.post(url('/counter-sales')).set(csrf).send({ lines: [{ partId: parts.brakePartId, binId: parts.binId, condition: 'new', quantity: 1 }, { partId: parts.plainPartId, binId: parts.binId, condition: 'new', quantity: 99 }] });
    expect(short.status).toBe(409);
    expect((await owner.get(`/api/shops/${shopId}/stock`).query({ partId: parts.brakePartId })).body.lines[0].onHand).toBe(8);
    const next = await issuedInvoice([{ kind: 'other', description: 'After the refused sale', quantity: 1, unitPriceMinor: 100 }]);
    expect(Number(next.number.slice(4))).toBe(numberBefore + 1);
    // A mechanic sees the sale but not its cost or margin.
    const seen = await expectStatus<Record<string, any>>(mechanic.get(url(`/invoices/${sale.id}`)), 200);
    expect(seen).not.toHaveProperty('marginMinor');
    expect(seen.lines[0]).not.toHaveProperty('unitCostMinor');
    await expectStatus(mechanic.post(url('/counter-sales')).set(csrf).send({ lines: [{ partId: parts.brakePartId, binId: parts.binId, condition: 'new', quantity: 1 }] }), 403);
  });
});

describe('invoices from jobs and vehicles', () => {
  it('takes a job’s issued (less returned) parts at sell prices and its labour at the recorded rate', async () => {
    const job = await expectStatus<{ id: string; number: number }>(
      owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'Brake overhaul', customerRequest: 'Brakes pull to the left.', assigneeIds: [mechanicId] }),
      201,
    );
    const jobs = (path: string) => `/api/shops/${shopId}/jobs/${job.id}${path}`;
    await expectStatus(mechanic.post(jobs('/parts/issues')).set(csrf).send({ partId: parts.brakePartId, binId: parts.binId, condition: 'new', quantity: 3 }), 201);
    await expectStatus(mechanic.post(jobs('/parts/returns')).set(csrf).send({ partId: parts.brakePartId, binId: parts.binId, condition: 'new', quantity: 1 }), 201);
    await expectStatus(mechanic.post(jobs('/labour')).set(csrf).send({ userId: mechanicId, workedOn: '2026-01-15', minutes: 100, description: 'Stripped and relined the front brake' }), 201);
    const inv = await expectStatus<Record<string, any>>(owner.post(url('/invoices/from-job')).set(csrf).send({ jobId: job.id }), 201);
    expect(inv).toMatchObject({ source: 'job', jobId: job.id, jobNumber: job.number, status: 'draft', customerId: vehicles.customerId });
    // 2 shoes at 18.55 = 37.10; 100 min = 1.6667 h × 60.00 = 100.002 → 100.00.
    expect(inv.lines.map((l: Record<string, unknown>) => [l.kind, l.quantity, l.unitPriceMinor, l.netMinor])).toEqual([
      ['part', '2', 1855, 3710],
      ['labour', '1.6667', 6000, 10000],
    ]);
    expect(inv).toMatchObject({ netMinor: 13710, taxMinor: 2742, grossMinor: 16452 });
    // The price of a line can be set by hand on the draft (the owner's permission); it shows as overridden.
    const changed = await expectStatus<Record<string, any>>(
      owner
        .patch(url(`/invoices/${inv.id}`))
        .set(csrf)
        .send({ lines: [{ kind: 'part', partId: parts.brakePartId, description: inv.lines[0].description, quantity: '2', unitPriceMinor: 1700 }, { kind: 'labour', description: inv.lines[1].description, quantity: '1.6667', unitPriceMinor: 6000 }] }),
      200,
    );
    expect(changed.lines[0]).toMatchObject({ unitPriceMinor: 1700, listedUnitPriceMinor: 1855, priceOverridden: true });
    const again = await owner.post(url('/invoices/from-job')).set(csrf).send({ jobId: job.id });
    expect(again.status).toBe(409);
    expect(again.body.error.details.reason).toBe('job_already_invoiced');
    await expectStatus(outsider.post(url('/invoices/from-job', otherShopId)).set(csrf).send({ jobId: job.id }), 404);
  });

  it('sells a ready shop-stock vehicle without safety blockers and marks it sold when issued', async () => {
    const vehicleId = randomUUID();
    const at = new Date(Date.UTC(2026, 0, 10));
    await ctx.db.write((m) =>
      m.insert(VehicleEntity, {
        id: vehicleId, shopId, kind: 'shop_stock', marque: 'Corvale', model: 'Sprite 350', year: 1962, colour: null, frameNumber: 'CV-35021', engineNumber: null, vin: null,
        vinCheckAcknowledgedByUserId: null, vinCheckAcknowledgedAt: null, condition: 'sorted_rider', notes: null, customerId: null, acquisitionCostMinor: 300000, askingPriceMinor: 450000,
        status: 'in_work', statusSince: at, numbersMatching: null, numbersCheckedByUserId: null, numbersCheckedAt: null, numbersNote: null, createdAt: at, updatedAt: at,
      }),
    );
    const draft = await expectStatus<Record<string, any>>(owner.post(url('/invoices/from-vehicle')).set(csrf).send({ vehicleId, customerName: 'Eli Stanwick', priceMinor: 420000, taxRatePercent: 0 }), 201);
    expect(draft).toMatchObject({ source: 'vehicle', grossMinor: 420000, marginMinor: 120000 });
    // Still in work: it cannot be sold yet, and no number is used.
    const refused = await owner.post(url(`/invoices/${draft.id}/issue`)).set(csrf).send({});
    expect(refused.status).toBe(409);
    expect(refused.body.error.details.reason).toBe('vehicle_not_ready');
    await expectStatus(owner.post(`/api/shops/${shopId}/vehicles/${vehicleId}/status`).set(csrf).send({ to: 'ready' }), 200);
    // A safety-critical checklist item failed on one of its jobs holds the sale back (the jobs' blockers).
    const template = await expectStatus<{ id: string }>(
      owner
        .post(`/api/shops/${shopId}/checklist-templates`)
        .set(csrf)
        .send({ name: 'Pre-sale brake check', items: [{ key: 'brakes', section: 'Brakes', label: 'Brakes work and hold', kind: 'check', safety: true }] }),
      201,
    );
    const job = await expectStatus<{ id: string; checklists: Array<{ id: string }> }>(
      owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId, title: 'Pre-sale check', customerRequest: 'Check before sale.', templateIds: [template.id] }),
      201,
    );
    const item = `/api/shops/${shopId}/jobs/${job.id}/checklists/${job.checklists[0]!.id}/items/brakes`;
    await expectStatus(owner.put(item).set(csrf).send({ result: 'fail', note: 'Rear wheel cylinder weeping.' }), 200);
    const blocked = await owner.post(url(`/invoices/${draft.id}/issue`)).set(csrf).send({});
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.details.reason).toBe('safety_blockers');
    await expectStatus(owner.put(item).set(csrf).send({ result: 'ok' }), 200);
    const issued = await expectStatus<Record<string, any>>(owner.post(url(`/invoices/${draft.id}/issue`)).set(csrf).send({}), 200);
    expect(issued.status).toBe('issued');
    const vehicle = await owner.get(`/api/shops/${shopId}/vehicles/${vehicleId}`);
    expect(vehicle.body.status).toBe('sold');
  });
});

describe('tenancy and audit', () => {
  it('answers 404 for another shop’s invoice, and audits every write', async () => {
    const inv = await issuedInvoice([{ kind: 'other', description: 'Tenancy', quantity: 1, unitPriceMinor: 100 }]);
    await expectStatus(outsider.get(url(`/invoices/${inv.id}`, otherShopId)), 404);
    await expectStatus(outsider.post(url(`/invoices/${inv.id}/payments`, otherShopId)).set(csrf).send({ method: 'cash', amountMinor: 1, receivedOn: '2026-01-15' }), 404);
    await expectStatus(outsider.get(url(`/invoices/${inv.id}`)), 404);
    const audit = await expectStatus<{ events: Array<{ action: string; entityId: string }> }>(owner.get(`/api/shops/${shopId}/audit-events`).query({ entity: 'invoice', pageSize: 100 }), 200);
    const actions = audit.events.filter((e) => e.entityId === inv.id).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['sales.invoice_created', 'sales.invoice_issued']));
  });
});
