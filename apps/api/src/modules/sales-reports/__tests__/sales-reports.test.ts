import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';
import { ageBucket, ageInDays, periodStart, periodStarts } from '../periods';

// Sales reports (issue 12) over invoices made through the sales API: figures worked by hand below.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let ctx: TestContext;
let shopId: string;
let owner: Agent;
let viewer: Agent;
let mechanic: Agent;
let stock: StockFixture;
const url = (path: string) => `/api/shops/${shopId}/sales-reports${path}`;

async function issued(body: Record<string, unknown>): Promise<{ id: string; lines: Array<{ id: string }> }> {
  const draft = await owner.post(`/api/shops/${shopId}/sales/invoices`).set(csrf).send(body);
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const done = await owner.post(`/api/shops/${shopId}/sales/invoices/${draft.body.id}/issue`).set(csrf).send({ sendEmail: false });
  expect(done.status, JSON.stringify(done.body)).toBe(200);
  return draft.body;
}

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  stock = await seedStockFixture(ctx.db, shopId, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);

  // The test clock stands at 2026-01-15; invoices are issued now and their issue times moved back
  // (moving the clock instead would end the shop's trial). Invoice A — 4 parts at 4.00 (cost 2.50 each at issue) and 2 h labour at 60.00.
  //   net 1 600 + 12 000 = 13 600; tax 20 % = 320 + 2 400 = 2 720; gross 16 320.
  const a = await issued({
    customerName: 'Avery Lantern',
    lines: [
      { kind: 'part', partId: stock.partId, description: 'Fixture part', quantity: 4, unitPriceMinor: 400 },
      { kind: 'labour', description: 'Fitting', quantity: '2', unitPriceMinor: 6000 },
    ],
  });
  // Invoice B — one line of 100.00: net 10 000, tax 2 000, gross 12 000; 50.00 paid.
  const b = await issued({ customerName: '=SUM(A1:A9)', lines: [{ kind: 'other', description: 'Storage', quantity: 1, unitPriceMinor: 10_000 }] });
  const paid = await owner.post(`/api/shops/${shopId}/sales/invoices/${b.id}/payments`).set(csrf).send({ method: 'cash', amountMinor: 5000, receivedOn: '2026-01-15' });
  expect(paid.status, JSON.stringify(paid.body)).toBeLessThan(300);
  // Credit note on A for one part: net 400, tax 80, gross 480 (cost 250 back).
  const credit = await owner.post(`/api/shops/${shopId}/sales/invoices/${a.id}/credit-notes`).set(csrf).send({ lines: [{ lineId: a.lines[0]!.id, quantity: '1' }], reason: 'One part returned unused' });
  expect(credit.status, JSON.stringify(credit.body)).toBeLessThan(300);
  // A issued 2025-10-07 (100 days before 2026-01-15), B and the credit note 2025-11-16 (60 days before).
  await ctx.db.write(async (m) => {
    await m.query(`UPDATE invoices SET issued_at = ? WHERE id = ?`, ['2025-10-07 10:00:00.000', a.id]);
    await m.query(`UPDATE invoices SET issued_at = ? WHERE id = ? OR credited_invoice_id = ?`, ['2025-11-16 10:00:00.000', b.id, a.id]);
  });
}, 60_000);
afterAll(() => ctx.close());

describe('periods', () => {
  it('starts weeks on Monday (ISO 8601) and months on the 1st', () => {
    expect(periodStart('2026-01-15', 'week')).toBe('2026-01-12'); // a Thursday
    expect(periodStart('2026-01-12', 'week')).toBe('2026-01-12');
    expect(periodStart('2026-01-18', 'week')).toBe('2026-01-12'); // Sunday
    expect(periodStart('2026-03-01', 'week')).toBe('2026-02-23');
    expect(periodStart('2026-02-28', 'month')).toBe('2026-02-01');
    expect(periodStarts('2025-12-30', '2026-02-02', 'month')).toEqual(['2025-12-01', '2026-01-01', '2026-02-01']);
  });
  it('ages debts into 0–30, 31–60, 61–90 and 90+ days', () => {
    expect([0, 30, 31, 60, 61, 90, 91].map(ageBucket)).toEqual(['0-30', '0-30', '31-60', '31-60', '61-90', '61-90', '90+']);
    expect(ageInDays('2025-10-07', '2026-01-15')).toBe(100);
    expect(ageInDays('2025-11-16', '2026-01-15')).toBe(60);
  });
});

describe('sales reports', () => {
  it('sums sales by month with credit notes against their month (worked by hand)', async () => {
    const res = await viewer.get(url('/sales?from=2025-10-01&to=2026-01-31&period=month'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.rows.map((r: { start: string; invoices: number; creditNotes: number; netMinor: number; taxMinor: number; grossMinor: number }) => [r.start, r.invoices, r.creditNotes, r.netMinor, r.taxMinor, r.grossMinor])).toEqual([
      ['2025-10-01', 1, 0, 13_600, 2_720, 16_320],
      // 10 000 − 400 = 9 600; 2 000 − 80 = 1 920; 12 000 − 480 = 11 520
      ['2025-11-01', 1, 1, 9_600, 1_920, 11_520],
      ['2025-12-01', 0, 0, 0, 0, 0],
      ['2026-01-01', 0, 0, 0, 0, 0],
    ]);
    expect(res.body.totals).toEqual({ netMinor: 23_200, taxMinor: 4_640, grossMinor: 27_840 });
  });

  it('gives the owner gross margin on parts (sell − cost at issue) and labour; nobody else', async () => {
    const res = await owner.get(url('/margins?from=2025-10-01&to=2025-11-30&period=month'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Oct: parts 1 600 − 4 × 250 = 600; labour 12 000. Nov: the credit note takes back 400 − 250 = 150.
    expect(res.body.rows.map((r: { partsNetMinor: number; partsCostMinor: number; partsMarginMinor: number; labourMarginMinor: number }) => [r.partsNetMinor, r.partsCostMinor, r.partsMarginMinor, r.labourMarginMinor])).toEqual([
      [1_600, 1_000, 600, 12_000],
      [-400, -250, -150, 0],
    ]);
    expect((await viewer.get(url('/margins'))).status).toBe(403);
    expect((await viewer.get(url('/margins.csv'))).status).toBe(403);
    expect((await mechanic.get(url('/sales'))).status).toBe(403);
  });

  it('ages unpaid invoices as of today', async () => {
    const res = await viewer.get(url('/unpaid'));
    expect(res.status).toBe(200);
    expect(res.body.asOf).toBe('2026-01-15');
    // A: 16 320 − 480 credited = 15 840 due, 100 days → 90+. B: 12 000 − 5 000 = 7 000 due, 60 days → 31-60.
    expect(res.body.buckets).toEqual([
      { bucket: '0-30', count: 0, dueMinor: 0 },
      { bucket: '31-60', count: 1, dueMinor: 7_000 },
      { bucket: '61-90', count: 0, dueMinor: 0 },
      { bucket: '90+', count: 1, dueMinor: 15_840 },
    ]);
    expect(res.body.totalDueMinor).toBe(22_840);
  });

  it('exports CSV with the formula guard', async () => {
    const res = await viewer.get(url('/unpaid.csv'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.text.split('\r\n')[0]).toBe('"invoice","customer","issued_on","age_days","age_bucket","gross_GBP","due_GBP"');
    expect(res.text).toContain(`"'=SUM(A1:A9)"`);
    const sales = await viewer.get(url('/sales.csv?from=2025-10-01&to=2025-10-31&period=month'));
    expect(sales.text).toContain('"2025-10-01","Oct 2025","1","0","136.00","27.20","163.20"');
  });

  it('refuses a window that ends before it starts', async () => {
    expect((await owner.get(url('/sales?from=2026-03-01&to=2026-01-01'))).status).toBe(400);
  });
});
