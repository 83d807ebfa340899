import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { partSearchQuerySchema, type PartSearchQuery } from '@tappet/contracts';
import { foldLookalikes, normalisePartNumber } from '@tappet/domain';
import { createTestContext, csrf, onPostgres, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { FitmentEntity, PartEntity, PartLinkEntity, PartSupplierNumberEntity } from '../../catalogue/catalogue.entity';
import { createCatalogueService } from '../../catalogue/catalogue.service';
import type { Agent } from '../../catalogue/__tests__/helpers';
import { createLookupService } from '../lookup.service';
import { bestByScore, kthLargest, lackingTooMany, markCharacters, memoryPartSearchIndex, sortYielding } from '../memory-part-search-index';
import { keysWithinTypos, sqlitePartSearchIndex } from '../part-search-index';

let ctx: TestContext;
let shopId: string;
let otherShopId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  shopId = (await seedShop(ctx, ['viewer'])).shop.id;
  otherShopId = (await seedShop(ctx, ['viewer'])).shop.id;
});
afterAll(() => ctx.close());

// Generated catalogues crowded on purpose: few prefixes and digits, shared words, lookalike letters,
// so numbers sit one or two edits apart and every candidate route (exact, prefix, contains, LIKE
// patterns, trigrams, description words) has work to do.
const prefix = fc.constantFrom('71', '64', 'RP', 'GK', 'BRK', 'VX', 'O1', '7I', '');
const separator = fc.constantFrom('-', '/', ' ', '.', '');
const digits = fc.string({ unit: fc.constantFrom('1', '3', '4', '5', '6', '0', 'O'), minLength: 2, maxLength: 7 });
const printed = fc.tuple(prefix, separator, digits).map(([p, s, d]) => `${p}${p ? s : ''}${d}`).filter((n) => normalisePartNumber(n).length > 0);
const word = fc.constantFrom('clutch', 'cable', 'brake', 'shoe', 'gasket', 'carburettor', 'float', 'needle', 'inner', 'later', 'head', 'cylinder', 'switch', 'Clutch', 'CABLE', 'tête', 'Ölpumpe');
const partArb = fc.record({
  number: printed,
  description: fc.array(word, { minLength: 1, maxLength: 4 }).map((w) => w.join(' ')),
  category: fc.constantFrom(null, 'Controls', 'controls', 'Brakes', 'Électrics'),
  origin: fc.constantFrom('genuine', 'reproduction', 'pattern') as fc.Arbitrary<'genuine' | 'reproduction' | 'pattern'>,
  status: fc.constantFrom('available', 'nla') as fc.Arbitrary<'available' | 'nla'>,
  supplier: fc.array(printed, { maxLength: 2 }),
  equivalents: fc.array(printed, { maxLength: 2 }),
  fitment: fc.option(fc.record({ marque: fc.constantFrom('Corvan', 'corvan', 'Aldine'), model: fc.constantFrom('Tern', 'Heron'), yearFrom: fc.option(fc.integer({ min: 1950, max: 1970 })), span: fc.option(fc.integer({ min: 0, max: 10 })) })),
});
const catalogueArb = fc.record({
  parts: fc.uniqueArray(partArb, { minLength: 1, maxLength: 40, selector: (p) => normalisePartNumber(p.number) }),
  links: fc.array(fc.record({ from: fc.nat(), to: fc.nat(), kind: fc.constantFrom('replaced_by', 'equivalent') as fc.Arbitrary<'replaced_by' | 'equivalent'> }), { minLength: 2, maxLength: 10 }),
});
/** A typo'd query: one of the catalogue's numbers (or words) with up to two edits, or something typed freely. */
const edit = fc.record({ at: fc.nat(), kind: fc.constantFrom('drop', 'add', 'change', 'swap'), char: fc.constantFrom('3', '5', '0', 'O', 'I', '1', 'a', 'e', '-') });
function applyEdits(text: string, edits: Array<{ at: number; kind: string; char: string }>): string {
  let s = text;
  for (const e of edits) {
    const i = s.length === 0 ? 0 : e.at % s.length;
    if (e.kind === 'drop') s = s.slice(0, i) + s.slice(i + 1);
    else if (e.kind === 'add') s = s.slice(0, i) + e.char + s.slice(i);
    else if (e.kind === 'change') s = s.slice(0, i) + e.char + s.slice(i + 1);
    else if (i + 1 < s.length) s = s.slice(0, i) + s[i + 1] + s[i] + s.slice(i + 2);
  }
  return s;
}
const queryArb = fc.record({
  from: fc.nat(),
  source: fc.constantFrom('number', 'supplier', 'description', 'tail', 'free'),
  edits: fc.array(edit, { maxLength: 2 }),
  free: fc.string({ unit: fc.constantFrom('7', '1', '3', '4', '5', '6', 'O', 'R', 'P', '-', ' ', 'c', 'a', 'b', 'l', 'e'), minLength: 1, maxLength: 9 }),
  limit: fc.constantFrom(3, 10, 50),
  filters: fc.record({
    marque: fc.option(fc.constantFrom('Corvan', 'CORVAN', 'Aldine'), { nil: undefined }),
    model: fc.option(fc.constantFrom('Tern', 'heron'), { nil: undefined }),
    year: fc.option(fc.integer({ min: 1950, max: 1982 }), { nil: undefined }),
    category: fc.option(fc.constantFrom('controls', 'BRAKES', 'électrics'), { nil: undefined }),
    origin: fc.option(fc.constantFrom('genuine', 'reproduction') as fc.Arbitrary<'genuine' | 'reproduction'>, { nil: undefined }),
  }),
  filtered: fc.boolean(),
});


/** Rows for a generated catalogue in a shop (parts, supplier numbers, equivalents' numbers, links, fitments). */
function toRows(shop: string, parts: Array<{ number: string; description: string; category: string | null; origin: 'genuine' | 'reproduction' | 'pattern'; status: 'available' | 'nla'; supplier: string[]; equivalents: string[]; fitment: { marque: string; model: string; yearFrom: number | null; span: number | null } | null }>, links: Array<{ from: number; to: number; kind: 'replaced_by' | 'equivalent' }>) {
  const at = new Date();
  const partRows = parts.map((p) => ({ id: randomUUID(), shopId: shop, number: p.number, key: normalisePartNumber(p.number), description: p.description, origin: p.origin, maker: null, category: p.category, unit: 'each', status: p.status, notes: null, createdAt: at, updatedAt: at }));
  const supplierRows = parts.flatMap((p, i) => [...new Map(p.supplier.map((n) => [normalisePartNumber(n), n])).entries()].map(([key, number]) => ({ shopId: shop, partId: partRows[i]!.id, number, key })));
  const linkRows = new Map<string, object>();
  parts.forEach((p, i) => {
    for (const number of p.equivalents) {
      const key = normalisePartNumber(number);
      linkRows.set(`${i} equivalent ${key}`, { id: randomUUID(), shopId: shop, fromPartId: partRows[i]!.id, kind: 'equivalent', toPartId: null, toNumber: number, toKey: key, quantity: 1, interchange: 'both', effectiveDate: null, sourceReference: null, note: null });
    }
  });
  for (const l of links) {
    const from = partRows[l.from % partRows.length]!;
    const to = partRows[l.to % partRows.length]!;
    if (from.id === to.id) continue;
    linkRows.set(`${from.id} ${l.kind} ${to.key}`, { id: randomUUID(), shopId: shop, fromPartId: from.id, kind: l.kind, toPartId: to.id, toNumber: to.number, toKey: to.key, quantity: 1, interchange: 'one_way', effectiveDate: null, sourceReference: null, note: null });
  }
  const fitmentRows = parts.flatMap((p, i) =>
    p.fitment ? [{ id: randomUUID(), shopId: shop, partId: partRows[i]!.id, marque: p.fitment.marque, model: p.fitment.model, yearFrom: p.fitment.yearFrom, yearTo: p.fitment.yearFrom !== null && p.fitment.span !== null ? p.fitment.yearFrom + p.fitment.span : null, frameFrom: null, frameTo: null }] : [],
  );
  return { partRows, supplierRows, linkRows: [...linkRows.values()], fitmentRows };
}

async function replaceCatalogue(shop: string, rows: ReturnType<typeof toRows>) {
  await ctx.db.write(async (manager) => {
    for (const table of ['fitments', 'part_links', 'part_supplier_numbers', 'parts']) await manager.query(`DELETE FROM ${table} WHERE shop_id = ?`, [shop]);
    if (rows.partRows.length) await manager.insert(PartEntity, rows.partRows);
    if (rows.supplierRows.length) await manager.insert(PartSupplierNumberEntity, rows.supplierRows);
    if (rows.linkRows.length) await manager.insert(PartLinkEntity, rows.linkRows);
    if (rows.fitmentRows.length) await manager.insert(FitmentEntity, rows.fitmentRows);
  });
}

// SQLite-specific by nature (decision 019): compares the in-memory index with SQLite's FTS5 ranking, which pg_trgm does not reproduce.
describe.skipIf(onPostgres())('the in-memory index finds what the SQLite FTS index finds', () => {
  it('same results (ids, order, match kinds, reasons) over generated catalogues and typo’d queries', async () => {
    // What the generated queries exercised, so the comparison is known to cover every kind of match.
    const seen = new Map<string, number>();
    await fc.assert(
      fc.asyncProperty(catalogueArb, catalogueArb, fc.array(queryArb, { minLength: 1, maxLength: 12 }), async (mine, theirs, queries) => {
        const rows = toRows(shopId, mine.parts, mine.links);
        await replaceCatalogue(shopId, rows);
        // Another shop with its own (often the same) numbers: neither index may leak it.
        const shared = [...new Map([...theirs.parts, ...mine.parts.slice(0, 5)].map((p) => [normalisePartNumber(p.number), p])).values()];
        await replaceCatalogue(otherShopId, toRows(otherShopId, shared, theirs.links));
        const catalogue = createCatalogueService({ db: ctx.db, clock: ctx.clock });
        const sqlite = createLookupService({ index: sqlitePartSearchIndex(() => ctx.db.reader), graphOf: catalogue.graphOf });
        // A tiny slice: the build reads and indexes the catalogue in many pieces, pausing between them.
        const memory = createLookupService({ index: memoryPartSearchIndex({ reader: () => ctx.db.reader, versionOf: catalogue.graphOf, slice: 3 }), graphOf: catalogue.graphOf });
        const mineIds = new Set<string>(rows.partRows.map((p) => p.id));
        for (const query of queries) {
          const part = mine.parts[query.from % mine.parts.length]!;
          const base =
            query.source === 'number' ? part.number
            : query.source === 'supplier' ? (part.supplier[0] ?? part.number)
            : query.source === 'description' ? part.description
            : query.source === 'tail' ? part.number.slice(Math.min(3, part.number.length - 1))
            : query.free;
          const q = applyEdits(base, query.edits).trim();
          if (!q) continue;
          const input: PartSearchQuery = { q, limit: query.limit, ...(query.filtered ? query.filters : {}) };
          const parsed = partSearchQuerySchema.parse(input);
          const expected = await sqlite.search(shopId, parsed);
          const actual = await memory.search(shopId, parsed);
          expect(actual, JSON.stringify(input)).toEqual(expected);
          expect(actual.results.every((r) => mineIds.has(r.id))).toBe(true);
          for (const r of actual.results) seen.set(r.match, (seen.get(r.match) ?? 0) + 1);
        }
      }),
      { numRuns: 60 },
    );
    for (const kind of ['exact', 'lineage', 'partial', 'fuzzy']) expect(seen.get(kind) ?? 0, kind).toBeGreaterThan(5);
  }, 120_000);
});

describe('the in-memory index follows the catalogue', () => {
  let owner: Agent;
  beforeAll(async () => {
    const shop = await seedShop(ctx, ['owner']);
    shopId = shop.shop.id;
    owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  });

  const search = async (q: string, extra: Record<string, string | number> = {}) => {
    const res = await owner.get(`/api/shops/${shopId}/parts/search`).query({ q, ...extra });
    expect(res.status).toBe(200);
    return res.body.results as Array<{ id: string; number: string; match: string }>;
  };

  it('sees a renumbering, supplier numbers, equivalents and fitment changes on the next lookup', async () => {
    const created = await owner.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: 'QT-5510', description: 'Follower arm' });
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    expect((await search('QT-5510'))[0]).toMatchObject({ id, match: 'exact' });
    expect((await owner.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ number: 'QT-6610', supplierNumbers: ['SP-40'] })).status).toBe(200);
    expect((await search('QT-5510')).map((r) => r.id)).not.toContain(id);
    expect((await search('QT6610'))[0]).toMatchObject({ id, match: 'exact' });
    expect((await search('SP-40'))[0]).toMatchObject({ id, match: 'exact' });
    // Fitments do not change the catalogue version: the fitment filter is read per lookup.
    expect(await search('follower', { marque: 'Corvan' })).toEqual([]);
    const fit = await owner.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: id, marque: 'Corvan', model: 'Tern', yearFrom: 1960, yearTo: 1965 });
    expect(fit.status).toBe(201);
    expect((await search('follower', { marque: 'corvan', year: 1962 })).map((r) => r.id)).toEqual([id]);
    expect((await owner.patch(`/api/shops/${shopId}/fitments/${fit.body.id as string}`).set(csrf).send({ yearTo: 1961 })).status).toBe(200);
    expect(await search('follower', { marque: 'corvan', year: 1962 })).toEqual([]);
    expect((await owner.delete(`/api/shops/${shopId}/fitments/${fit.body.id as string}`).set(csrf)).status).toBe(204);
    // An equivalent's number comes and goes with its link; a removed supplier number stops answering.
    const link = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: id, kind: 'equivalent', toNumber: 'EQ-8080', interchange: 'both' });
    expect(link.status).toBe(201);
    expect((await search('eq8080'))[0]).toMatchObject({ id, match: 'exact' });
    expect((await owner.delete(`/api/shops/${shopId}/part-links/${link.body.id as string}`).set(csrf)).status).toBe(204);
    expect(await search('eq8080')).toEqual([]);
    expect((await owner.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ supplierNumbers: [] })).status).toBe(200);
    expect(await search('SP-40')).toEqual([]);
  });
});

describe('the cache', () => {
  it('concurrent callers share one lineage graph (the version token), rebuilt after a change', async () => {
    const catalogue = createCatalogueService({ db: ctx.db, clock: ctx.clock });
    const [a, b] = await Promise.all([catalogue.graphOf(otherShopId), catalogue.graphOf(otherShopId)]);
    expect(a).toBe(b);
    await catalogue.writeCatalogue(otherShopId, async () => undefined);
    const c = await catalogue.graphOf(otherShopId);
    expect(c).not.toBe(a);
    expect(await catalogue.graphOf(otherShopId)).toBe(c);
  });

  it('builds once per catalogue version, and concurrent lookups share one build', async () => {
    let version = 1;
    const index = memoryPartSearchIndex({ reader: () => ctx.db.reader, versionOf: () => version });
    await Promise.all([index.byKey(otherShopId, 'X1'), index.byKey(otherShopId, 'X2'), index.byKey(otherShopId, 'X3')]);
    expect(index.builds()).toBe(1);
    await index.byKey(otherShopId, 'X1');
    expect(index.builds()).toBe(1);
    version = 2;
    await index.byKey(otherShopId, 'X1');
    expect(index.builds()).toBe(2);
    // Each shop has its own.
    await index.byKey(shopId, 'X1');
    expect(index.builds()).toBe(3);
  });

  it('a burst of lookups shares one build even when each sees a different token (graphs built concurrently)', async () => {
    let calls = 0;
    const index = memoryPartSearchIndex({ reader: () => ctx.db.reader, versionOf: async () => ({ graph: calls++ }) });
    await Promise.all(Array.from({ length: 5 }, () => index.byKey(otherShopId, 'X1')));
    expect(index.builds()).toBe(1);
    // A lookup that arrives after that build with a token never seen before must not trust it.
    await index.byKey(otherShopId, 'X1');
    expect(index.builds()).toBe(2);
  });
});

describe('sorting while letting other work run', () => {
  it('puts distinct strings in the order Array.prototype.sort gives, across many runs and merges', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uniqueArray(fc.string({ unit: fc.constantFrom('A', 'B', '0', '9', 'é', ' '), maxLength: 6 }), { maxLength: 200 }), fc.integer({ min: 1, max: 8 }), async (keys, slice) => {
        expect(await sortYielding([...keys], slice)).toEqual([...keys].sort());
      }),
      { numRuns: 300 },
    );
  });
});

describe('choosing typo candidates without sorting them all', () => {
  // Scores drawn from a few values, so ties at the cut-off are common.
  const scored = fc.array(fc.constantFrom(0.5, 1, 1.25, 2, 3.75), { minLength: 1, maxLength: 60 });

  it('the k-th largest value is the one a descending sort puts at k', () => {
    fc.assert(
      fc.property(scored, fc.nat(), (values, at) => {
        const k = 1 + (at % values.length);
        expect(kthLargest(Float64Array.from(values), k)).toBe([...values].sort((a, b) => b - a)[k - 1]);
      }),
      { numRuns: 500 },
    );
  });

  it('the best documents by score, ties to the lower document, are those a full sort keeps', () => {
    fc.assert(
      fc.property(scored, fc.nat({ max: 70 }), (values, limit) => {
        const scores = Float64Array.from(values);
        // Documents in the order the postings first touch them: not sorted.
        const docs = values.map((_, doc) => doc).reverse();
        const expected = [...docs].sort((a, b) => scores[b]! - scores[a]! || a - b).slice(0, limit);
        expect(bestByScore(docs, scores, limit).sort((a, b) => a - b)).toEqual(expected.sort((a, b) => a - b));
      }),
      { numRuns: 500 },
    );
  });

  it('the character test never turns away keys within the typo tolerance', () => {
    let turnedAway = 0;
    const key = fc.string({ unit: fc.constantFrom('1', '3', '4', '5', 'O', 'R', 'P', 'X', 'É'), minLength: 1, maxLength: 10 });
    fc.assert(
      fc.property(key, fc.array(key, { minLength: 1, maxLength: 3 }), (typed, keys) => {
        const folded = foldLookalikes(typed);
        const text = ` ${keys.map(foldLookalikes).join(' ')} `;
        const masks = new Uint32Array(2);
        markCharacters(masks, 0, text);
        const lacking = lackingTooMany(masks, folded)(0);
        if (lacking) turnedAway++;
        if (keysWithinTypos(folded, text)) expect(lacking).toBe(false);
      }),
      { numRuns: 2000 },
    );
    // The test has teeth: plenty of keys were turned away.
    expect(turnedAway).toBeGreaterThan(100);
  });
});
