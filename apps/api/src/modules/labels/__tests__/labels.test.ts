import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Response } from 'supertest';
import { maxLabelsPerRequest } from '@tappet/contracts';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedCatalogueFixture, type CatalogueFixture } from '../../catalogue/catalogue.test-fixture';
import { AuditEventEntity } from '../../audit/audit.entity';
import { PartEntity } from '../../catalogue/catalogue.entity';
import { seedLabelBin } from '../labels.test-fixture';
import { decodeCode128, decodeQr, readLabelPdf } from './read-label-pdf';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
let catalogue: CatalogueFixture;
let otherCatalogue: CatalogueFixture;

beforeAll(async () => {
  ctx = await createTestContext();
  shop = await seedShop(ctx);
  other = await seedShop(ctx, ['owner']);
  catalogue = await seedCatalogueFixture(ctx.db, shop.shop.id, 0);
  otherCatalogue = await seedCatalogueFixture(ctx.db, other.shop.id, 0);
});
afterAll(() => ctx.close());

const as = (role: 'owner' | 'mechanic' | 'buyer' | 'viewer') => signedInAgent(ctx.app, shop.byRole[role].email, shop.password);
const url = () => `/api/shops/${shop.shop.id}/labels`;

/** supertest buffers unknown media types only when asked to. */
const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('part labels', () => {
  for (const role of ['owner', 'mechanic', 'buyer', 'viewer'] as const) {
    it(`${role === 'owner' ? 'an' : 'a'} ${role} prints labels for chosen parts in the shop's format, writing nothing`, async () => {
      const agent = await as(role);
      const audits = await ctx.db.reader.count(AuditEventEntity);
      const res = await agent.post(`${url()}/parts`).set(csrf).send({ partIds: [catalogue.otherPartId, catalogue.partId], copies: 2 }).buffer(true).parse(binary).expect(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toBe('inline; filename="part-labels-a4-3x8.pdf"');
      expect(res.headers['x-label-count']).toBe('4');
      const [page, ...more] = await readLabelPdf(res.body as Buffer);
      expect(more).toHaveLength(0);
      expect(page!.width).toBeCloseTo(595.28, 1);
      // In the order chosen, each twice.
      const codes = page!.symbols.filter((s) => s.tag === 'TappetCode128').map((s) => decodeCode128(s.rects));
      expect(codes).toEqual(['FX-2000', 'FX-2000', 'FX-1000', 'FX-1000']);
      expect(page!.texts.map((t) => t.text)).toContain('Fixture part FX-1000');
      expect(await ctx.db.reader.count(AuditEventEntity)).toBe(audits);
    });
  }

  it("follows the owner's format setting, and a print may choose another", async () => {
    const owner = await as('owner');
    const mechanic = await as('mechanic');
    await owner.patch(`/api/shops/${shop.shop.id}/settings`).set(csrf).send({ labelSheetFormat: 'letter-3x10' }).expect(200);
    expect((await mechanic.get(`${url()}/options`).expect(200)).body.defaultFormat).toBe('letter-3x10');
    const letter = await mechanic.post(`${url()}/parts`).set(csrf).send({ partIds: [catalogue.partId] }).buffer(true).parse(binary).expect(200);
    expect((await readLabelPdf(letter.body as Buffer))[0]!.width).toBeCloseTo(612, 1);
    const roll = await mechanic.post(`${url()}/parts`).set(csrf).send({ partIds: [catalogue.partId, catalogue.otherPartId], format: 'roll-62x29' }).buffer(true).parse(binary).expect(200);
    const pages = await readLabelPdf(roll.body as Buffer);
    expect(pages.map((p) => [Math.round(p.width * 100) / 100, Math.round(p.height * 100) / 100])).toEqual([
      [175.75, 82.2],
      [175.75, 82.2],
    ]);
    expect(roll.headers['x-page-count']).toBe('2');
    await owner.patch(`/api/shops/${shop.shop.id}/settings`).set(csrf).send({ labelSheetFormat: 'a4-3x8' }).expect(200);
  });

  it('lists the formats with their sizes', async () => {
    const res = await (await as('viewer')).get(`${url()}/options`).expect(200);
    expect(res.body.formats.map((f: { id: string; labelsPerPage: number }) => [f.id, f.labelsPerPage])).toEqual([
      ['a4-3x8', 24],
      ['letter-3x10', 30],
      ['roll-62x29', 1],
    ]);
  });

  it("answers 404 for another shop's part, or an unknown one, and renders nothing", async () => {
    const owner = await as('owner');
    for (const partIds of [[otherCatalogue.partId], [catalogue.partId, otherCatalogue.partId], [randomUUID()]]) {
      const res = await owner.post(`${url()}/parts`).set(csrf).send({ partIds }).expect(404);
      expect(res.body.error.code).toBe('not_found');
    }
    // And another shop's labels route is a 404 as a whole.
    await owner.post(`/api/shops/${other.shop.id}/labels/parts`).set(csrf).send({ partIds: [otherCatalogue.partId] }).expect(404);
    await owner.get(`/api/shops/${other.shop.id}/labels/options`).expect(404);
  });

  it('refuses requests over the limits and anything it does not know', async () => {
    const owner = await as('owner');
    const tooMany = Array.from({ length: 201 }, () => randomUUID());
    const cases: unknown[] = [
      { partIds: [] },
      { partIds: tooMany },
      { partIds: [catalogue.partId, catalogue.partId] },
      { partIds: [catalogue.partId], copies: 0 },
      { partIds: [catalogue.partId], copies: 51 },
      { partIds: [catalogue.partId], copies: 1.5 },
      { partIds: Array.from({ length: 13 }, () => randomUUID()), copies: 50 },
      { partIds: [catalogue.partId], format: 'a5' },
      { partIds: [catalogue.partId], skip: 30 },
      { partIds: ['not-an-id'] },
      { partIds: [catalogue.partId], shopId: other.shop.id },
    ];
    for (const body of cases) {
      const res = await owner.post(`${url()}/parts`).set(csrf).send(body as object);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
    // 12 × 50 = 600 is the most one request may print.
    expect(12 * 50).toBe(maxLabelsPerRequest);
  });

  it('needs the CSRF header and a session', async () => {
    const owner = await as('owner');
    await owner.post(`${url()}/parts`).send({ partIds: [catalogue.partId] }).expect(403);
  });
});

describe('bin labels', () => {
  it('prints a label per bin and, when asked, the parts stocked in it with their bin', async () => {
    const binA = await seedLabelBin(ctx.db, shop.shop.id, 'A-01-03', [
      { partId: catalogue.otherPartId, onHand: 4 },
      { partId: catalogue.partId, onHand: 2 },
    ], 'Top shelf, carburettor parts');
    const empty = await seedLabelBin(ctx.db, shop.shop.id, 'B-EMPTY', [{ partId: catalogue.partId, onHand: 0 }]);
    const viewer = await as('viewer');

    const bare = await viewer.post(`${url()}/bins`).set(csrf).send({ binIds: [binA, empty] }).buffer(true).parse(binary).expect(200);
    const [bins] = await readLabelPdf(bare.body as Buffer);
    expect(bins!.symbols.filter((s) => s.tag === 'TappetQR').map((s) => decodeQr(s.rects))).toEqual(['A-01-03', 'B-EMPTY']);
    const words = bins!.texts.map((t) => t.text);
    expect(words).toEqual(expect.arrayContaining(['Top shelf, carburettor parts', '2 parts', '0 parts']));

    const full = await viewer.post(`${url()}/bins`).set(csrf).send({ binIds: [binA], contents: true, format: 'roll-62x29' }).buffer(true).parse(binary).expect(200);
    const pages = await readLabelPdf(full.body as Buffer);
    // The bin first, then its parts by number, each naming the bin.
    expect(pages.map((p) => decodeCode128(p.symbols.find((s) => s.tag === 'TappetCode128')!.rects))).toEqual(['A-01-03', 'FX-1000', 'FX-2000']);
    expect(pages[1]!.texts.map((t) => t.text)).toContain('Bin A-01-03');

    // A part label names the bins the part sits in, fullest first.
    const part = await viewer.post(`${url()}/parts`).set(csrf).send({ partIds: [catalogue.partId], format: 'roll-62x29' }).buffer(true).parse(binary).expect(200);
    expect((await readLabelPdf(part.body as Buffer))[0]!.texts.map((t) => t.text)).toContain('Bins A-01-03, B-EMPTY');
  });

  it('refuses bins whose contents would need more than 200 different labels', async () => {
    const at = new Date(Date.UTC(2026, 0, 15));
    const parts = Array.from({ length: 200 }, (_, i) => ({ id: randomUUID(), shopId: shop.shop.id, number: `BIG-${i}`, key: `BIG${i}`, description: 'Washer', origin: 'genuine' as const, maker: null, category: null, unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at }));
    await ctx.db.write((m) => m.insert(PartEntity, parts));
    const big = await seedLabelBin(ctx.db, shop.shop.id, 'HUGE-BIN', parts.map((p) => ({ partId: p.id, onHand: 1 })));
    const owner = await as('owner');
    // The bin itself and 200 parts: 201 different labels.
    const res = await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [big], contents: true }).expect(400);
    expect(res.body.error.message).toContain('at most 200 different labels');
    // Without its contents the bin's own label is fine.
    await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [big] }).expect(200);
  });

  it("answers 404 for another shop's bin", async () => {
    const foreign = await seedLabelBin(ctx.db, other.shop.id, 'Z-9', []);
    const own = await seedLabelBin(ctx.db, shop.shop.id, 'Z-9', []);
    const owner = await as('owner');
    await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [own, foreign] }).expect(404);
    await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [randomUUID()] }).expect(404);
    await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [own, own] }).expect(400);
    await owner.post(`${url()}/bins`).set(csrf).send({ binIds: [own], copies: 2 }).expect(400);
  });
});

