import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PartSearchResult } from '@tappet/contracts';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { PartEntity } from '../../catalogue/catalogue.entity';
import type { Agent } from '../../catalogue/__tests__/helpers';

let ctx: TestContext;
let owner: Agent;
let mechanic: Agent;
let shopId: string;
let otherShopId: string;
let otherOwner: Agent;
const ids = new Map<string, string>();

async function add(agent: Agent, shop: string, number: string, extra: Record<string, unknown> = {}): Promise<string> {
  const res = await agent.post(`/api/shops/${shop}/parts`).set(csrf).send({ number, description: `Part ${number}`, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

async function link(body: Record<string, unknown>) {
  const res = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}

async function search(q: string, extra: Record<string, string | number> = {}, agent = mechanic, shop = shopId): Promise<PartSearchResult[]> {
  const res = await agent.get(`/api/shops/${shop}/parts/search`).query({ q, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.results as PartSearchResult[];
}

const numbers = (results: PartSearchResult[]) => results.map((r) => r.number);

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx, ['owner', 'mechanic']);
  shopId = shop.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  const other = await seedShop(ctx, ['owner']);
  otherShopId = other.shop.id;
  otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);

  const parts: Array<[string, Record<string, unknown>]> = [
    ['71-3456', { description: 'Clutch cable, inner', category: 'Controls', origin: 'genuine', supplierNumbers: ['12-345'] }],
    ['64-3456', { description: 'Clutch cable, early type', category: 'Controls', status: 'nla' }],
    ['72-3456', { description: 'Clutch cable, later type', category: 'Controls' }],
    ['RP-3456', { description: 'Clutch cable, reproduction', origin: 'reproduction', category: 'Controls' }],
    ['71-34567', { description: 'Throttle cable', category: 'Controls' }],
    ['71-3465', { description: 'Brake light switch', category: 'Electrics' }],
    ['BRK-55120', { description: 'Brake shoe set, front', category: 'Brakes' }],
    ['GK-124400', { description: 'Cylinder head gasket', category: 'Gaskets' }],
    ['VX/880', { description: 'Carburettor float needle', category: 'Fuel' }],
  ];
  for (const [number, extra] of parts) ids.set(number, await add(owner, shopId, number, extra));
  await link({ fromPartId: ids.get('64-3456'), kind: 'replaced_by', toPartId: ids.get('71-3456'), interchange: 'one_way' });
  await link({ fromPartId: ids.get('71-3456'), kind: 'equivalent', toPartId: ids.get('RP-3456'), interchange: 'one_way' });
  await link({ fromPartId: ids.get('BRK-55120'), kind: 'equivalent', toNumber: 'EQ-777', interchange: 'both' });
  for (const [part, fit] of [
    ['BRK-55120', { marque: 'Corvan', model: 'Tern', yearFrom: 1962, yearTo: 1968 }],
    ['71-3465', { marque: 'Corvan', model: 'Tern', yearFrom: 1969, yearTo: 1974 }],
  ] as const) {
    const res = await owner.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: ids.get(part), ...fit });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  }
});
afterAll(() => ctx.close());

describe('what the lookup forgives', () => {
  it('case, spaces, dashes, dots and slashes', async () => {
    for (const typed of ['71-3456', '713456', '71 3456', '71.3456', '71/3456', '7 1 - 3 4 5 6']) {
      const [first] = await search(typed);
      expect(first, typed).toMatchObject({ number: '71-3456', match: 'exact', reason: 'exact number' });
    }
    expect((await search('vx880'))[0]).toMatchObject({ number: 'VX/880', match: 'exact' });
    expect((await search('rp.3456'))[0]).toMatchObject({ number: 'RP-3456', match: 'exact' });
  });

  it('a missing prefix: "3456" finds 71-3456 and its siblings before numbers that merely contain it', async () => {
    const results = await search('3456');
    const prefixless = results.filter((r) => r.reason === 'number contains 3456').map((r) => r.number);
    expect(prefixless.slice(0, 4).sort()).toEqual(['64-3456', '71-3456', '72-3456', 'RP-3456']);
    expect(results.find((r) => r.number === '71-34567')).toMatchObject({ match: 'partial' });
    expect(numbers(results).indexOf('71-34567')).toBeGreaterThan(3);
  });

  it('one typo in a number under 8 characters, not two', async () => {
    const results = await search('71-4356');
    expect(results[0]).toMatchObject({ number: '71-3456', match: 'fuzzy', reason: 'close to 71-3456 (1 typo)' });
    expect(numbers(await search('17-4356'))).not.toContain('71-3456');
  });

  it('two typos in a number of 8 characters or more, not three', async () => {
    expect((await search('8RK-55102'))[0]).toMatchObject({ number: 'BRK-55120', match: 'fuzzy', reason: 'close to BRK-55120 (2 typos)' });
    expect((await search('BRK-5S12'))[0]).toMatchObject({ number: 'BRK-55120', match: 'fuzzy', reason: 'close to BRK-55120 (2 typos)' });
    expect(numbers(await search('BKR-52510'))).not.toContain('BRK-55120');
  });

  it('letter O for zero and letter I for one', async () => {
    expect((await search('GK-I244OO'))[0]).toMatchObject({ number: 'GK-124400', match: 'exact', reason: 'exact number, reading O as 0 and I as 1' });
    expect((await search('GK-I2440'))[0]).toMatchObject({ number: 'GK-124400', match: 'partial' });
    expect((await search('7I-3457'))[0]).toMatchObject({ number: '71-3456', match: 'fuzzy' });
  });

  it('description words in any order, with typos in words of 5 letters or more', async () => {
    const inOrder = await search('clutch cable');
    expect(inOrder.find((r) => r.number === '72-3456')).toMatchObject({ match: 'partial', reason: 'description words: clutch cable' });
    const anyOrder = await search('cable later');
    expect(anyOrder[0]).toMatchObject({ number: '72-3456', reason: 'description words: cable later' });
    expect((await search('carburetor flaot'))[0]).toMatchObject({ number: 'VX/880', match: 'fuzzy', reason: 'description words: carburettor float' });
    expect((await search('head gasket'))[0]).toMatchObject({ number: 'GK-124400' });
    // "hed" is under 5 letters: no typo forgiven there.
    expect(numbers(await search('hed gasket'))).not.toContain('GK-124400');
  });

  it('supplier numbers and equivalents’ numbers count as the part’s own', async () => {
    expect((await search('12.345'))[0]).toMatchObject({ number: '71-3456', match: 'exact', reason: 'supplier number 12-345' });
    expect((await search('eq777'))[0]).toMatchObject({ number: 'BRK-55120', match: 'exact', reason: 'equivalent number EQ-777' });
    expect((await search('12-354'))[0]).toMatchObject({ number: '71-3456', match: 'fuzzy', reason: 'close to 12-345 (1 typo)' });
  });
});

describe('ranking and answer', () => {
  it('exact first, then lineage relatives, then numbers containing the query, then typos', async () => {
    const results = await search('64-3456');
    expect(results[0]).toMatchObject({ number: '64-3456', match: 'exact' });
    expect(results.find((r) => r.number === '71-3456')).toMatchObject({ match: 'lineage', reason: 'replaces 64-3456' });
    const kinds = (await search('71-3456')).map((r) => r.match);
    const order = { exact: 0, lineage: 1, partial: 2, fuzzy: 3 };
    expect(kinds).toEqual([...kinds].sort((a, b) => order[a] - order[b]));
    expect(new Set(kinds)).toEqual(new Set(['exact', 'lineage', 'partial', 'fuzzy']));
    const full = await search('71-3456');
    expect(full.find((r) => r.number === 'RP-3456')).toMatchObject({ match: 'lineage', reason: 'can stand in for 71-3456 (one way)' });
    expect(full.find((r) => r.number === '71-3465')).toMatchObject({ match: 'fuzzy' });
    expect(full[0]).toEqual({ id: ids.get('71-3456'), number: '71-3456', description: 'Clutch cable, inner', origin: 'genuine', category: 'Controls', status: 'available', match: 'exact', reason: 'exact number', stock: { onHand: 0, held: 0, free: 0, lines: [] } });
  });

  it('filters by fitment (marque, model, year), category and origin', async () => {
    expect(numbers(await search('brake', { marque: 'corvan', model: 'Tern', year: 1965 }))).toEqual(['BRK-55120']);
    expect(numbers(await search('brake', { marque: 'Corvan', year: 1971 }))).toEqual(['71-3465']);
    expect(numbers(await search('brake', { marque: 'Elsewhere' }))).toEqual([]);
    expect(numbers(await search('3456', { origin: 'reproduction' }))).toEqual(['RP-3456']);
    expect(numbers(await search('cable', { category: 'Controls' })).sort()).toEqual(['64-3456', '71-3456', '71-34567', '72-3456', 'RP-3456']);
    // A filtered-out exact hit still brings its lineage relatives that pass the filter.
    expect(numbers(await search('71-3456', { origin: 'reproduction' }))).toEqual(['RP-3456']);
  });

  it('caps the answer at the limit: 20 by default, at most 50', async () => {
    const many = Array.from({ length: 60 }, (_, i) => `LM-${String(i).padStart(3, '0')}`);
    for (const n of many) await add(owner, shopId, n, { description: 'Limit filler' });
    expect(await search('LM')).toHaveLength(20);
    expect(await search('LM', { limit: 5 })).toHaveLength(5);
    expect(await search('LM', { limit: 50 })).toHaveLength(50);
    const tooMany = await mechanic.get(`/api/shops/${shopId}/parts/search`).query({ q: 'LM', limit: 51 });
    expect(tooMany.status).toBe(400);
    expect((await mechanic.get(`/api/shops/${shopId}/parts/search`).query({ q: '' })).status).toBe(400);
    expect((await mechanic.get(`/api/shops/${shopId}/parts/search`).query({ q: 'x', sort: 'y' })).status).toBe(400);
  });

  it('follows the catalogue as it changes: renumbered parts, new supplier numbers', async () => {
    const id = await add(owner, shopId, 'ZZ-1000', { description: 'Renumber me' });
    expect((await search('ZZ-1000'))[0]?.id).toBe(id);
    expect((await owner.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ number: 'YW-2877', supplierNumbers: ['SUP-9'] })).status).toBe(200);
    expect(numbers(await search('ZZ-1000'))).not.toContain('YW-2877');
    expect((await search('yw2877'))[0]).toMatchObject({ id, match: 'exact' });
    expect((await search('SUP9'))[0]).toMatchObject({ id, reason: 'supplier number SUP-9' });
  });
});

describe('tenant isolation', () => {
  it('another shop holding 10,000 closer matches still finds this shop’s part first, and none of theirs', async () => {
    const at = new Date();
    const crowd = Array.from({ length: 10_000 }, (_, i) => {
      const number = `71-4356-${String(i).padStart(4, '0')}`;
      return { id: randomUUID(), shopId: otherShopId, number, key: number.replace(/-/g, ''), description: 'Clutch cable crowd', origin: 'genuine' as const, maker: null, category: null, unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at };
    });
    await ctx.db.write(async (manager) => {
      for (let i = 0; i < crowd.length; i += 500) await manager.insert(PartEntity, crowd.slice(i, i + 500));
    });
    await add(otherOwner, otherShopId, '71-4356', { description: 'Their exact number' });
    const theirs = new Set<string>(crowd.map((c) => c.id));

    const results = await search('71-4356', { limit: 50 });
    expect(results[0]).toMatchObject({ number: '71-3456', match: 'fuzzy' });
    expect(results.every((r) => !theirs.has(r.id) && r.description !== 'Their exact number')).toBe(true);
    const words = await search('clutch cable', { limit: 50 });
    expect(words.length).toBeGreaterThan(0);
    expect(words.every((r) => !theirs.has(r.id))).toBe(true);
    // And the other shop finds its own.
    expect((await search('71-4356', {}, otherOwner, otherShopId))[0]).toMatchObject({ number: '71-4356', match: 'exact' });
  });

  it('another shop’s id is a 404 for a member of this one', async () => {
    const res = await mechanic.get(`/api/shops/${otherShopId}/parts/search`).query({ q: '71-4356' });
    expect(res.status).toBe(404);
  });
});
