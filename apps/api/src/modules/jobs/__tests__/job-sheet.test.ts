import type { Response } from 'superagent';
import { PDFDocument } from 'pdf-lib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { readLabelPdf } from '../../labels/__tests__/read-label-pdf';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';
import { seedVehicleFixture, type VehicleFixture } from '../../vehicles/vehicles.test-fixture';

// The printable job sheet (issue 10): read back through pdf-lib's parser and the labels tests'
// content-stream reader (not the code that wrote it).

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let owner: Agent;
let mechanic: Agent;
let outsider: Agent;
let mechanicId: string;
let vehicles: VehicleFixture;
let stock: StockFixture;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  mechanicId = shop.byRole.mechanic.id;
  vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0);
  stock = await seedStockFixture(ctx.db, shopId, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
}, 60_000);
afterAll(() => ctx.close());

const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

/** Every text run of every page, in order, joined by newlines. */
async function textOf(pdf: Buffer): Promise<string> {
  const pages = await readLabelPdf(pdf);
  return pages.map((p) => p.texts.map((t) => t.text).join('\n')).join('\n');
}

describe('the job sheet PDF', () => {
  it('prints the vehicle, request, people, results with readings in the shop’s unit, the unresolved signed-off item, parts, labour, cost and the cautions', async () => {
    const url = (path = '') => `/api/shops/${shopId}/jobs${path}`;
    expect((await owner.patch(`/api/shops/${shopId}/settings`).set(csrf).send({ pressureUnit: 'bar' })).status).toBe(200);
    const templates = (await owner.get(`/api/shops/${shopId}/checklist-templates`).expect(200)).body.templates as Array<{ id: string; name: string }>;
    const recommissioning = templates.find((t) => t.name.startsWith('Recommissioning'))!;
    const created = await owner.post(url()).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'Recommission after storage', customerRequest: 'Stood in a barn for twelve years; get it running.', assigneeIds: [mechanicId], templateIds: [recommissioning.id] });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const jobId = created.body.id as string;
    const checklistId = created.body.checklists[0].id as string;
    const item = (key: string) => url(`/${jobId}/checklists/${checklistId}/items/${key}`);

    // 1 psi = 6.894 757 kPa and 1 bar = 100 kPa (NIST SP 811, appendix B.8): 130 psi = 896.3 kPa = 8.96 bar.
    expect((await mechanic.put(item('compression')).set(csrf).send({ result: 'ok', compression: { unit: 'psi', readings: [130, 128] } })).status).toBe(200);
    expect((await mechanic.put(item('brake-hydraulics')).set(csrf).send({ result: 'fail', note: 'Front caliper seized.' })).status).toBe(200);
    expect((await mechanic.put(item('lights')).set(csrf).send({ result: 'ok' })).status).toBe(200);
    const signed = await owner
      .post(url(`/${jobId}/sign-offs`))
      .set(csrf)
      .send({ checklistId, itemKey: 'brake-hydraulics', reason: 'Customer collects on a trailer; caliper to be done at home.', customerTold: true, customerToldHow: 'Phoned the customer on 15 Jan.' });
    expect(signed.status).toBe(201);
    expect((await mechanic.post(url(`/${jobId}/parts/issues`)).set(csrf).send({ partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 2 })).status).toBe(201);
    const labour = await mechanic.post(url(`/${jobId}/labour`)).set(csrf).send({ userId: mechanicId, workedOn: '2026-01-15', minutes: 90, description: 'Stripped and cleaned carburettors' });
    expect(labour.status).toBe(201);
    const cost = labour.body.cost as { partsMinor: number; labourMinor: number; totalMinor: number };
    // 2 at 2.50 from the stock fixture; 1.5 h at the default 60.00 an hour.
    expect(cost).toMatchObject({ partsMinor: 500, labourMinor: 9000, totalMinor: 9500 });

    const res = await mechanic.get(url(`/${jobId}/sheet.pdf`)).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    const doc = await PDFDocument.load(pdf);
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(1);
    expect(doc.getTitle()).toContain('Job sheet');

    // Nothing runs off the page: every text run sits inside the A4 page's 44 pt margins (the
    // footer sits in the bottom margin), and no two runs on a line overlap.
    for (const page of await readLabelPdf(pdf)) {
      for (const run of page.texts) {
        expect(run.x, run.text).toBeGreaterThanOrEqual(43.9);
        expect(run.x + run.width, run.text).toBeLessThanOrEqual(page.width - 43.9);
        expect(run.y, run.text).toBeGreaterThanOrEqual(20);
        expect(run.y, run.text).toBeLessThanOrEqual(page.height - 43.9);
      }
      const byLine = new Map<number, typeof page.texts>();
      for (const run of page.texts) byLine.set(Math.round(run.y), [...(byLine.get(Math.round(run.y)) ?? []), run]);
      for (const runs of byLine.values()) {
        const sorted = [...runs].sort((a, b) => a.x - b.x);
        for (let i = 1; i < sorted.length; i++) expect(sorted[i]!.x, `${sorted[i - 1]!.text} | ${sorted[i]!.text}`).toBeGreaterThanOrEqual(sorted[i - 1]!.x + sorted[i - 1]!.width);
      }
    }

    const text = await textOf(pdf);
    expect(text).toContain(`Job sheet: job ${created.body.number as number}`);
    expect(text).toContain('Stood in a barn for twelve years; get it running.');
    expect(text).toContain(`${created.body.vehicle.marque as string} ${created.body.vehicle.model as string}`);
    expect(text).toContain(signed.body.assignees[0].name);
    // Compression in bar, the shop's unit.
    expect(text).toMatch(/#1 9 bar, #2 8\.8 bar/);
    expect(text).toContain('Calipers, master cylinders and hoses: no seizing, no leaks [safety-critical]');
    expect(text).toContain('Note: Front caliper seized.');
    expect(text).toContain('UNRESOLVED: failed; signed off by');
    expect(text).toContain('Reason: Customer collects on a trailer; caliper to be done at home.');
    expect(text).toContain('Customer told: Phoned the customer on 15 Jan.');
    // Items still unrecorded block hand-over and say so.
    expect(text).toContain('OPEN SAFETY ITEM: not recorded');
    expect(text).toContain('Stripped and cleaned carburettors');
    expect(text).toContain('1.50 h');
    expect(text).toMatch(/Total\n£95\.00/);
    expect(text).toContain('Brake fluids do not mix');
    expect(text).toContain('Fuel vapour and fire');
    expect(text).toContain('does not state that this vehicle is roadworthy');
  });

  it('answers 404 to another shop', async () => {
    const created = await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'Another job', customerRequest: '' });
    expect(created.status).toBe(201);
    expect((await outsider.get(`/api/shops/${shopId}/jobs/${created.body.id as string}/sheet.pdf`)).status).toBe(404);
  });
});
