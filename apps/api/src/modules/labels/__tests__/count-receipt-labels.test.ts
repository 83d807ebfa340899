import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Response } from 'supertest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedCatalogueFixture, type CatalogueFixture } from '../../catalogue/catalogue.test-fixture';
import { seedPurchasingFixture, type PurchasingFixture } from '../../purchasing/purchasing.test-fixture';
import { seedLabelBin } from '../labels.test-fixture';
import { decodeCode128, decodeQr, readLabelPdf } from './read-label-pdf';

// Labels chosen from a stock count (its bins) and from purchase receipts (what arrived), issue 7.

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
let catalogue: CatalogueFixture;
let purchasing: PurchasingFixture;

beforeAll(async () => {
  ctx = await createTestContext();
  shop = await seedShop(ctx);
  other = await seedShop(ctx, ['owner']);
  catalogue = await seedCatalogueFixture(ctx.db, shop.shop.id, 0);
  purchasing = await seedPurchasingFixture(ctx.db, shop.shop.id, 2);
});
afterAll(() => ctx.close());

const as = (role: 'owner' | 'mechanic' | 'buyer' | 'viewer') => signedInAgent(ctx.app, shop.byRole[role].email, shop.password);
const url = (shopId = shop.shop.id) => `/api/shops/${shopId}/labels`;
const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('count labels', () => {
  it('prints the labels of a count’s bins (and their contents) for every role; another shop’s count is a 404', async () => {
    const b1 = await seedLabelBin(ctx.db, shop.shop.id, 'CN-02', [{ partId: catalogue.partId, onHand: 2 }], 'Second shelf');
    const b2 = await seedLabelBin(ctx.db, shop.shop.id, 'CN-01', [{ partId: catalogue.otherPartId, onHand: 5 }]);
    const owner = await as('owner');
    const start = await owner.post(`/api/shops/${shop.shop.id}/counts`).set(csrf).send({ binIds: [b1, b2] });
    expect(start.status, JSON.stringify(start.body)).toBe(201);
    const countId = start.body.id as string;

    for (const role of ['mechanic', 'viewer'] as const) {
      const res = await (await as(role)).post(`${url()}/counts/${countId}`).set(csrf).send({ format: 'a4-3x8' }).buffer(true).parse(binary).expect(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['x-label-count']).toBe('2');
      const [page] = await readLabelPdf(res.body as Buffer);
      // A4 portrait in points (210 × 297 mm at 72/25.4).
      expect(page!.width).toBeCloseTo(595.28, 1);
      expect(page!.height).toBeCloseTo(841.89, 1);
      // Bins by code.
      expect(page!.symbols.filter((s) => s.tag === 'TappetQR').map((s) => decodeQr(s.rects))).toEqual(['CN-01', 'CN-02']);
    }

    const withContents = await owner.post(`${url()}/counts/${countId}`).set(csrf).send({ contents: true, format: 'roll-62x29' }).buffer(true).parse(binary).expect(200);
    const pages = await readLabelPdf(withContents.body as Buffer);
    expect(pages.map((p) => decodeCode128(p.symbols.find((s) => s.tag === 'TappetCode128')!.rects))).toEqual(['CN-01', 'FX-2000', 'CN-02', 'FX-1000']);

    const foreign = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    expect((await foreign.post(`${url(other.shop.id)}/counts/${countId}`).set(csrf).send({})).status).toBe(404);
    expect((await owner.post(`${url()}/counts/${other.shop.id}`).set(csrf).send({})).status).toBe(404);
    expect((await owner.post(`${url()}/counts/${countId}`).set(csrf).send({ format: 'a5' })).status).toBe(400);
    expect((await owner.post(`/api/shops/${shop.shop.id}/counts/${countId}/abandon`).set(csrf)).status).toBe(200);
  });
});

describe('receipt labels', () => {
  it('prints one label per unit received (or one per receipt) naming the part and its bin', async () => {
    const buyer = await as('buyer');
    const orderId = purchasing.nextSentId();
    const lineId = purchasing.nextSentLineId(orderId);
    const received = await buyer.post(`/api/shops/${shop.shop.id}/purchasing/orders/${orderId}/receipts`).set(csrf).send({ lines: [{ lineId, quantity: 3, binId: purchasing.binId }] });
    expect(received.status, JSON.stringify(received.body)).toBe(200);
    const receipt = (received.body.receipts as Array<{ id: string; lineId: string }>).find((r) => r.lineId === lineId)!;
    const line = (received.body.lines as Array<{ id: string; partNumber?: string; partId: string }>).find((l) => l.id === lineId)!;
    const [row] = await ctx.db.reader.query<Array<{ number: string }>>(`SELECT number FROM parts WHERE id = ?`, [line.partId]);
    const number = row!.number;

    const viewer = await as('viewer');
    const each = await viewer.post(`${url()}/receipts`).set(csrf).send({ receiptIds: [receipt.id], format: 'letter-3x10' }).buffer(true).parse(binary).expect(200);
    expect(each.headers['x-label-count']).toBe('3');
    const [page] = await readLabelPdf(each.body as Buffer);
    expect(page!.width).toBeCloseTo(612, 1);
    expect(page!.height).toBeCloseTo(792, 1);
    expect(page!.symbols.filter((s) => s.tag === 'TappetCode128').map((s) => decodeCode128(s.rects))).toEqual([number, number, number]);
    expect(page!.texts.map((t) => t.text)).toContain('Bin PF-BIN');

    const once = await viewer.post(`${url()}/receipts`).set(csrf).send({ receiptIds: [receipt.id], perUnit: false }).buffer(true).parse(binary).expect(200);
    expect(once.headers['x-label-count']).toBe('1');

    const foreign = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    expect((await foreign.post(`${url(other.shop.id)}/receipts`).set(csrf).send({ receiptIds: [receipt.id] })).status).toBe(404);
    expect((await viewer.post(`${url()}/receipts`).set(csrf).send({ receiptIds: [] })).status).toBe(400);
    expect((await viewer.post(`${url()}/receipts`).send({ receiptIds: [receipt.id] })).status).toBe(403);
  });
});
