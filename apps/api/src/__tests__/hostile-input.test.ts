import fc from 'fast-check';
import type { Express } from 'express';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '../db/write-lock';
import { createTestContext, csrf, onPostgres, seedShop, signedInAgent, type TestContext } from '../test-support/test-app';

// Hostile input (issue 13): malformed, oversized, deep, wrongly typed and Unicode-tricked input to
// the search, resolve, import, upload and form endpoints. Expected every time: a clear 4xx in the
// error shape (or a normal answer), never a 5xx, and never a partial write.

let ctx: TestContext;
let agent: ReturnType<typeof request.agent>;
let shopId: string;
let partId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  const seeded = await seedShop(ctx, ['owner']);
  shopId = seeded.shop.id;
  agent = await signedInAgent(ctx.app as Express, seeded.byRole.owner.email, seeded.password);
  const part = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: '71-3456', description: 'Clutch cable, inner' }).expect(201);
  partId = part.body.id as string;
});
afterAll(() => ctx.close());

/** Row counts of every table: a refused request must leave all of them as they were. */
async function tableCounts(db: Database): Promise<Record<string, number>> {
  const tables = (await db.reader.query(
    onPostgres()
      ? `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY name`
      : `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'part_search_%' ORDER BY name`,
  )) as Array<{ name: string }>;
  const out: Record<string, number> = {};
  for (const { name } of tables) {
    const [row] = (await db.reader.query(`SELECT count(*) AS n FROM "${name}"`)) as Array<{ n: number }>;
    out[name] = row!.n;
  }
  return out;
}

function expectRefusedCleanly(res: request.Response) {
  expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(400);
  expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
  expect(res.body).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
}

const deepJson = (depth: number) => `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`;

describe('bodies that are not what a form sends', () => {
  it.each([
    ['malformed JSON', '{"number": "71-1", "description": ', 'application/json'],
    ['JSON nested 5,000 deep', deepJson(5000), 'application/json'],
    ['a top-level array', '[{"number":"71-1","description":"x"}]', 'application/json'],
    ['a bare string', '"71-1"', 'application/json'],
    ['null', 'null', 'application/json'],
    ['form encoding', 'number=71-1&description=x', 'application/x-www-form-urlencoded'],
    ['plain text', 'number 71-1', 'text/plain'],
    ['200 KB of JSON (over the 100 KB limit)', JSON.stringify({ number: '71-1', description: 'x'.repeat(200_000) }), 'application/json'],
  ])('%s → a clear 4xx, nothing written', async (_name, body, type) => {
    const before = await tableCounts(ctx.db);
    const res = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).set('Content-Type', type).send(body);
    expectRefusedCleanly(res);
    expect(await tableCounts(ctx.db)).toEqual(before);
  });

  it.each([
    ['a number too large for a double', '{"number":"71-9","description":"x","quantity":1e400}'],
    ['a huge integer for a quantity', `{"fromPartId":"PART","kind":"replaced_by","toNumber":"71-9","quantity":${'9'.repeat(400)}}`],
    ['a negative zero quantity', '{"fromPartId":"PART","kind":"replaced_by","toNumber":"71-9","quantity":-0}'],
    ['a string where a number belongs', '{"fromPartId":"PART","kind":"replaced_by","toNumber":"71-9","quantity":"2"}'],
    ['an unknown kind', '{"fromPartId":"PART","kind":"__proto__","toNumber":"71-9"}'],
    ['a prototype-polluting key', '{"fromPartId":"PART","kind":"replaced_by","toNumber":"71-9","__proto__":{"isAdmin":true}}'],
  ])('%s → a clear 4xx, nothing written', async (_name, raw) => {
    const before = await tableCounts(ctx.db);
    const res = await agent.post(`/api/shops/${shopId}/part-links`).set(csrf).set('Content-Type', 'application/json').send(raw.replace('PART', partId));
    expectRefusedCleanly(res);
    expect(await tableCounts(ctx.db)).toEqual(before);
    expect(({} as Record<string, unknown>)['isAdmin']).toBeUndefined();
  });
});

describe('page sizes', () => {
  it.each([
    ['/parts', 100],
    ['/audit-events', 100],
    ['/customers', 100],
    ['/vehicles', 100],
    ['/sales/invoices', 100],
    ['/stock', 200],
    ['/stock/movements', 200],
  ])('%s takes pages of up to %i rows and refuses a larger page with a clear 400', async (list, cap) => {
    const at = await agent.get(`/api/shops/${shopId}${list}`).query({ pageSize: cap });
    expect(at.status, JSON.stringify(at.body)).toBe(200);
    for (const pageSize of [cap + 1, 1e9, -1, 'all']) expectRefusedCleanly(await agent.get(`/api/shops/${shopId}${list}`).query({ pageSize }));
  });
});

describe('Unicode tricks in text fields', () => {
  it.each([
    ['a right-to-left override', '71-34\u202E65'],
    ['zero-width spaces', '71\u200B-3456'],
    ['a NUL byte', '71-34\u000056'],
    ['full-width digits', '７１-３４５６'],
    ['a lone surrogate', '71-\uD800'],
    ['only combining marks', '\u0301\u0301\u0301'],
  ])('a part number with %s is refused or stored as letters and digits only, never a 5xx', async (_name, number) => {
    const before = await tableCounts(ctx.db);
    const res = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number, description: 'Unicode test' });
    if (res.status === 201) {
      // Accepted: the key the lookup matches on holds nothing but A–Z and 0–9.
      const part = await agent.get(`/api/shops/${shopId}/parts/${res.body.id as string}`).expect(200);
      expect(part.body.key ?? '').toMatch(/^[A-Z0-9]*$/);
    } else {
      expectRefusedCleanly(res);
      expect(await tableCounts(ctx.db)).toEqual(before);
    }
  });
});

describe('generated input (fast-check)', () => {
  it('the lookup answers any text and any filters with 200 or a clear 400', async () => {
    await fc.assert(
      fc.asyncProperty(fc.string({ unit: 'binary', maxLength: 150 }), fc.dictionary(fc.constantFrom('limit', 'year', 'origin', 'category', 'marque', 'model', 'page', 'x'), fc.string({ unit: 'binary', maxLength: 30 }), { maxKeys: 3 }), async (q, filters) => {
          const res = await agent.get(`/api/shops/${shopId}/parts/search`).query({ q, ...filters });
          if (res.status === 200) expect(Array.isArray(res.body.results)).toBe(true);
          else expectRefusedCleanly(res);
        }),
      { numRuns: 120 },
    );
  });

  it('resolving any text answers 200 or a clear 400', async () => {
    await fc.assert(
      fc.asyncProperty(fc.string({ unit: 'binary', maxLength: 80 }), async (number) => {
        const res = await agent.get(`/api/shops/${shopId}/lineage/resolve`).query({ number });
        if (res.status !== 200) expectRefusedCleanly(res);
      }),
      { numRuns: 80 },
    );
  });

  it('any JSON value sent to the part form is refused cleanly or stored whole, never half', async () => {
    const field = fc.oneof(fc.string({ unit: 'binary', maxLength: 60 }), fc.integer(), fc.double(), fc.boolean(), fc.constant(null), fc.array(fc.string(), { maxLength: 3 }), fc.object({ maxDepth: 2 }));
    const body = fc.oneof(
      fc.record({ number: field, description: field, origin: field, category: field, status: field, supplierNumbers: field }, { requiredKeys: [] }),
      fc.jsonValue({ maxDepth: 4 }),
    );
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const before = await tableCounts(ctx.db);
        const res = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).set('Content-Type', 'application/json').send(JSON.stringify(b));
        if (res.status === 201) return;
        expectRefusedCleanly(res);
        expect(await tableCounts(ctx.db)).toEqual(before);
      }),
      { numRuns: 100 },
    );
  });

  it('any bytes under any name, uploaded as a vehicle file, are stored whole or refused cleanly, never half', async () => {
    const vehicle = await agent.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Fuzzwell', model: 'Upload' }).expect(201);
    const url = `/api/shops/${shopId}/vehicles/${vehicle.body.id as string}/files`;
    const bytes = fc.oneof(
      fc.uint8Array({ minLength: 1, maxLength: 3000 }).map((a) => Buffer.from(a)),
      // Real magic numbers followed by junk: sniffed as an image or a PDF, then unreadable.
      fc.tuple(fc.constantFrom('ffd8ffe0', '89504e470d0a1a0a', '52494646000000005745425056503820', '255044462d312e'), fc.uint8Array({ maxLength: 2000 })).map(([magic, rest]) => Buffer.concat([Buffer.from(magic, 'hex'), Buffer.from(rest)])),
    );
    const name = fc.oneof(fc.constantFrom('../../etc/passwd', '..\\..\\boot.ini', 'a\u0000b.jpg', '\u202Egpj.exe', 'CON', '.htaccess', ' '), fc.string({ unit: 'grapheme', minLength: 1, maxLength: 80 }));
    await fc.assert(
      fc.asyncProperty(bytes, name, async (file, fileName) => {
        const before = await tableCounts(ctx.db);
        const res = await agent.post(url).set(csrf).attach('files', file, fileName);
        if (res.status === 201) {
          expect(res.body.files).toHaveLength(1);
          // The name kept for showing is a last path segment without NUL (the stored key is the server's own).
          const shown = res.body.files[0].originalName as string;
          expect(shown).not.toMatch(/[\\/]/);
          expect(shown.includes('\u0000')).toBe(false);
          return;
        }
        expectRefusedCleanly(res);
        expect(await tableCounts(ctx.db)).toEqual(before);
      }),
      { numRuns: 40 },
    );
  });

  it('files that are not CSV, sent to the catalogue import, get row errors or a clear 4xx and import nothing', async () => {
    const notCsv = fc.oneof(
      fc.uint8Array({ minLength: 0, maxLength: 4000 }).map((a) => Buffer.from(a)),
      fc.string({ unit: 'binary', maxLength: 2000 }).map((s) => Buffer.from(s)),
      fc.constantFrom(
        Buffer.from('\uFEFF'),
        Buffer.from('number,description\n"71-1,unbalanced quote\n'),
        Buffer.from(`${Array.from({ length: 5000 }, (_, i) => `c${i}`).join(',')}\n1\n`),
        Buffer.from(`number,description\n${'9'.repeat(100_000)},long\n`),
        Buffer.from('PK\u0003\u0004 a zip file pretending'),
        Buffer.from('number,description\n=HYPERLINK("http://example.test"),formula\n'),
      ),
    );
    await fc.assert(
      fc.asyncProperty(notCsv, fc.constantFrom('parts', 'links', 'fitments'), fc.constantFrom('../../etc/passwd', 'a\u0000b.csv', 'catalogue.csv', 'ñ\u202Egpj.csv'), async (file, kind, name) => {
        const before = await tableCounts(ctx.db);
        const res = await agent.post(`/api/shops/${shopId}/imports`).set(csrf).field('kind', kind).field('mode', 'commit').attach('file', file, name);
        expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
        if (res.status === 200) {
          // A committed import of junk would have written rows: only an import with no errors may write.
          const after = await tableCounts(ctx.db);
          if (res.body.errors.length > 0) expect(after).toEqual(before);
        } else {
          expectRefusedCleanly(res);
          expect(await tableCounts(ctx.db)).toEqual(before);
        }
      }),
      { numRuns: 60 },
    );
  });
});
