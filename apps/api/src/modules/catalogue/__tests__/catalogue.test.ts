import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { PartEntity, PartLinkEntity, FitmentEntity } from '../catalogue.entity';
import { addLink, addPart, type Agent } from './helpers';

let ctx: TestContext;
let shopId: string;
let otherShopId: string;
let owner: Agent;
let buyer: Agent;
let mechanic: Agent;
let viewer: Agent;
let otherOwner: Agent;
const ids: Record<string, string> = {};

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  otherShopId = other.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);

  // A chain A → B (both) → C (one_way); a split S → S1 + 2×S2; a kit K ⊃ 2×K1 replacing X;
  // a with_changes replacement W → W2; an equivalent (one way) E → R; a cycle Y1 ⇄ Y2;
  // an nla dead end N; a link to a number not in the catalogue.
  for (const n of ['71-1000', '71-1001', '71-1002', '72-2000', '72-2001', '72-2002', 'KIT-10', '10-0001', '10-0002', '73-3000', '73-3001', '74-4000', 'RP-4000', '75-5000', '75-5001', '76-6000']) {
    ids[n] = await addPart(owner, shopId, n, n === '76-6000' ? { status: 'nla' } : n === 'RP-4000' ? { origin: 'reproduction', supplierNumbers: ['SUP 88/4000'] } : {});
  }
  const link = (from: string, kind: string, to: string, extra: Record<string, unknown> = {}) => addLink(owner, shopId, { fromPartId: ids[from], kind, toPartId: ids[to], ...extra });
  await link('71-1000', 'replaced_by', '71-1001');
  await link('71-1001', 'replaced_by', '71-1002', { interchange: 'one_way', effectiveDate: '1971-04-01', sourceReference: 'Bulletin 12' });
  await link('72-2000', 'replaced_by', '72-2001');
  await link('72-2000', 'replaced_by', '72-2002', { quantity: 2 });
  await link('KIT-10', 'kit_contains', '10-0001', { quantity: 2 });
  await link('10-0002', 'replaced_by', 'KIT-10');
  await link('73-3000', 'replaced_by', '73-3001', { interchange: 'with_changes' });
  await link('74-4000', 'equivalent', 'RP-4000', { interchange: 'one_way' });
  await link('75-5000', 'replaced_by', '75-5001');
  await link('75-5001', 'replaced_by', '75-5000');
  await addLink(owner, shopId, { fromPartId: ids['71-1002'], kind: 'equivalent', toNumber: 'ZZ-404' });
});
afterAll(() => ctx.close());

const resolve = (agent: Agent, number: string) => agent.get(`/api/shops/${shopId}/lineage/resolve`).query({ number });
const numbersOf = (option: { parts: Array<{ number: string; quantity: number }> }) => option.parts.map((p) => `${p.quantity}×${p.number}`).join(' + ');

describe('parts: create, read, update', () => {
  it('creates a part with defaults and its supplier numbers, audited', async () => {
    const res = await buyer.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: ' 0042-7 ', description: 'Float needle', maker: 'Velmark', supplierNumbers: ['QS 0042'] });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ number: '0042-7', key: '00427', origin: 'genuine', status: 'available', unit: 'each', maker: 'Velmark', supplierNumbers: ['QS 0042'] });
    const audit = await ctx.db.reader.findOne(AuditEventEntity, { where: { entityId: res.body.id, action: 'part.created' } });
    expect(audit?.changes).toMatchObject({ description: { before: null, after: 'Float needle' }, number: { before: null, after: '0042-7' }, supplierNumbers: { before: null, after: 'QS 0042' } });
    expect(audit?.changes).not.toHaveProperty('notes');
  });

  it('names the fields that fail validation', async () => {
    const res = await owner.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: '??', description: '', origin: 'aftermarket', colour: 'red' });
    expect(res.status).toBe(400);
    const paths = (res.body.error.details as Array<{ path: string[] }>).map((d) => d.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['number', 'description', 'origin']));
    expect(res.body.error.details.some((d: { message: string }) => /colour/.test(d.message))).toBe(true);
  });

  it('refuses a second part with the same normalised number (409)', async () => {
    const res = await owner.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: '71 1000', description: 'Duplicate' });
    expect(res.status).toBe(409);
  });

  it('updates a part and records before and after', async () => {
    const id = await addPart(owner, shopId, 'UP-1');
    const res = await buyer.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ description: 'Kickstart spring', status: 'nla' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ description: 'Kickstart spring', status: 'nla' });
    const audit = await ctx.db.reader.findOne(AuditEventEntity, { where: { entityId: id, action: 'part.updated' } });
    expect(audit?.changes).toEqual({ description: { before: 'Part UP-1', after: 'Kickstart spring' }, status: { before: 'available', after: 'nla' } });
  });

  it('changes only the fields sent (no defaults fill in on a patch)', async () => {
    const id = await addPart(owner, shopId, 'PT-1', { origin: 'pattern', unit: 'pair', status: 'nla', maker: 'Hollin', supplierNumbers: ['HP 1'] });
    const res = await owner.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ description: 'Brake shoes' });
    expect(res.body).toMatchObject({ description: 'Brake shoes', origin: 'pattern', unit: 'pair', status: 'nla', maker: 'Hollin', supplierNumbers: ['HP 1'] });
    const cleared = await owner.patch(`/api/shops/${shopId}/parts/${id}`).set(csrf).send({ maker: null });
    expect(cleared.body.maker).toBeNull();
  });

  it('renumbers a part: links show the new number, the old one no longer resolves, a taken number is 409', async () => {
    const from = await addPart(owner, shopId, 'RN-1');
    const to = await addPart(owner, shopId, 'RN-2');
    await addLink(owner, shopId, { fromPartId: from, kind: 'replaced_by', toPartId: to });
    const res = await owner.patch(`/api/shops/${shopId}/parts/${to}`).set(csrf).send({ number: 'RN-2A', supplierNumbers: ['ZB 2', 'ZA 1'] });
    expect(res.body).toMatchObject({ number: 'RN-2A', key: 'RN2A', supplierNumbers: ['ZA 1', 'ZB 2'] });
    const detail = await owner.get(`/api/shops/${shopId}/parts/${from}`);
    expect(detail.body.linksFrom[0]).toMatchObject({ toPartId: to, toNumber: 'RN-2A' });
    expect((await resolve(owner, 'RN-2')).status).toBe(404);
    expect((await resolve(owner, 'rn1')).body.current).toEqual([{ partId: to, number: 'RN-2A', quantity: 1 }]);
    // The same numbers in another order are no change.
    await owner.patch(`/api/shops/${shopId}/parts/${to}`).set(csrf).send({ supplierNumbers: ['ZB 2', 'ZA 1'] }).expect(200);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { entityId: to, action: 'part.updated' } })).toBe(1);
    const taken = await owner.patch(`/api/shops/${shopId}/parts/${to}`).set(csrf).send({ number: 'rn 1' });
    expect(taken.status).toBe(409);
  });

  it('lists with filters and paging, capped at 100 a page', async () => {
    const all = await mechanic.get(`/api/shops/${shopId}/parts`).query({ q: '71-10', pageSize: 2 });
    expect(all.status).toBe(200);
    expect(all.body.total).toBe(3);
    expect(all.body.items.map((p: { number: string }) => p.number)).toEqual(['71-1000', '71-1001']);
    const nla = await viewer.get(`/api/shops/${shopId}/parts`).query({ status: 'nla' });
    expect(nla.body.items.map((p: { number: string }) => p.number)).toContain('76-6000');
    const repro = await viewer.get(`/api/shops/${shopId}/parts`).query({ origin: 'reproduction' });
    expect(repro.body.items.map((p: { number: string }) => p.number)).toEqual(['RP-4000']);
    const bySupplier = await viewer.get(`/api/shops/${shopId}/parts`).query({ q: 'sup884000' });
    expect(bySupplier.body.items.map((p: { number: string }) => p.number)).toEqual(['RP-4000']);
    const problems = await viewer.get(`/api/shops/${shopId}/parts`).query({ problemsOnly: 'true', pageSize: 100 });
    const numbers = problems.body.items.map((p: { number: string }) => p.number);
    expect(numbers).toEqual(expect.arrayContaining(['75-5000', '75-5001', '76-6000']));
    expect(numbers).not.toContain('72-2000');
    expect(problems.body.items.every((p: { problemCount: number }) => p.problemCount > 0)).toBe(true);
    const tooMany = await viewer.get(`/api/shops/${shopId}/parts`).query({ pageSize: 101 });
    expect(tooMany.status).toBe(400);
  });

  it('shows a part with links both ways, fitments, current parts and problems', async () => {
    await owner.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: ids['71-1001'], marque: 'Corran', model: 'Tern 350', yearFrom: 1969, yearTo: 1972, frameFrom: 'CT 1200' });
    const res = await mechanic.get(`/api/shops/${shopId}/parts/${ids['71-1001']}`);
    expect(res.status).toBe(200);
    expect(res.body.linksFrom).toEqual([expect.objectContaining({ toNumber: '71-1002', fromNumber: '71-1001', interchange: 'one_way', effectiveDate: '1971-04-01', sourceReference: 'Bulletin 12' })]);
    expect(res.body.linksTo).toEqual([expect.objectContaining({ fromNumber: '71-1000', kind: 'replaced_by' })]);
    expect(res.body.fitments).toEqual([expect.objectContaining({ marque: 'Corran', model: 'Tern 350', yearFrom: 1969, yearTo: 1972, frameFrom: 'CT 1200', frameTo: null })]);
    expect(res.body.current).toEqual([{ partId: ids['71-1002'], number: '71-1002', quantity: 1 }]);
  });

  it('draws the lineage around a part with the current part marked', async () => {
    const res = await viewer.get(`/api/shops/${shopId}/parts/${ids['71-1000']}/lineage`);
    expect(res.status).toBe(200);
    const byNumber = new Map(res.body.nodes.map((n: { number: string }) => [n.number, n]));
    expect(byNumber.get('71-1000')).toMatchObject({ isFocus: true, isCurrent: false });
    expect(byNumber.get('71-1002')).toMatchObject({ isFocus: false, isCurrent: true, description: 'Part 71-1002' });
    expect(res.body.edges).toContainEqual({ from: ids['71-1001'], to: ids['71-1002'], kind: 'replaced_by', interchange: 'one_way', quantity: 1 });
    const cycle = await viewer.get(`/api/shops/${shopId}/parts/${ids['75-5000']}/lineage`);
    expect(cycle.body.nodes.every((n: { inProblem: boolean }) => n.inProblem)).toBe(true);
  });
});

describe('resolve', () => {
  it('follows a chain to its end and offers older parts only where they fit both ways', async () => {
    const start = await resolve(mechanic, '711000');
    expect(start.status).toBe(200);
    expect(start.body.part.number).toBe('71-1000');
    expect(start.body.current).toEqual([{ partId: ids['71-1002'], number: '71-1002', quantity: 1 }]);
    expect(start.body.canFill.map(numbersOf)).toEqual(expect.arrayContaining(['1×71-1000', '1×71-1001', '1×71-1002']));
    // 71-1001 → 71-1002 is one way: the newer part fills a demand for the older, never the reverse.
    const end = await resolve(mechanic, '71-1002');
    expect(end.body.canFill.map(numbersOf)).toEqual(['1×71-1002']);
  });

  it('resolves a split to parts needed together', async () => {
    const res = await resolve(viewer, '72.2000');
    expect(res.body.current).toEqual(expect.arrayContaining([expect.objectContaining({ number: '72-2001', quantity: 1 }), expect.objectContaining({ number: '72-2002', quantity: 2 })]));
    expect(res.body.canFill.map(numbersOf)).toContain('1×72-2001 + 2×72-2002');
  });

  it('resolves a number replaced by a kit to the kit', async () => {
    const res = await resolve(viewer, '10-0002');
    expect(res.body.current).toEqual([{ partId: ids['KIT-10'], number: 'KIT-10', quantity: 1 }]);
    const kit = await resolve(viewer, 'kit 10');
    expect(kit.body.current).toEqual([{ partId: ids['KIT-10'], number: 'KIT-10', quantity: 1 }]);
  });

  it('flags a with_changes replacement', async () => {
    const res = await resolve(viewer, '73-3000');
    const option = res.body.canFill.find((o: { parts: Array<{ number: string }> }) => o.parts[0]?.number === '73-3001');
    expect(option).toMatchObject({ needsChanges: true });
    expect(res.body.canFill.find((o: { parts: Array<{ number: string }> }) => o.parts[0]?.number === '73-3000')).toMatchObject({ needsChanges: false });
  });

  it('offers a one-way equivalent only in its direction, and finds parts by supplier number', async () => {
    const genuine = await resolve(viewer, '74-4000');
    expect(genuine.body.canFill.map(numbersOf)).toEqual(expect.arrayContaining(['1×74-4000', '1×RP-4000']));
    const repro = await resolve(viewer, 'sup 88-4000');
    expect(repro.body.part.number).toBe('RP-4000');
    expect(repro.body.canFill.map(numbersOf)).toEqual(['1×RP-4000']);
  });

  it('answers 404 with a clear message for an unknown number', async () => {
    const res = await resolve(viewer, 'NOPE-1');
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/NOPE-1/);
  });

  it('lists the data problems: the cycle once, the dead end, the unknown number', async () => {
    const res = await viewer.get(`/api/shops/${shopId}/catalogue/problems`);
    expect(res.status).toBe(200);
    const problems = res.body.problems as Array<{ kind: string; numbers: string[] }>;
    expect(problems.filter((p) => p.kind === 'cycle')).toEqual([{ kind: 'cycle', numbers: expect.arrayContaining(['75-5000', '75-5001']) }]);
    expect(problems).toContainEqual({ kind: 'dead_end', numbers: ['76-6000'] });
    expect(problems.find((p) => p.kind === 'unknown_number')?.numbers).toContain('ZZ-404');
    const cyc = await resolve(viewer, '75-5000');
    expect(cyc.body.problems.map((p: { kind: string }) => p.kind)).toContain('cycle');
  });

  it('sees a new link at once (the cached graph is refreshed on writes)', async () => {
    const before = await resolve(viewer, '73-3001');
    expect(before.body.current.map((c: { number: string }) => c.number)).toEqual(['73-3001']);
    const id = await addPart(buyer, shopId, '73-3002');
    const linkId = await addLink(buyer, shopId, { fromPartId: ids['73-3001'], kind: 'replaced_by', toPartId: id });
    expect((await resolve(viewer, '73-3001')).body.current.map((c: { number: string }) => c.number)).toEqual(['73-3002']);
    expect((await buyer.delete(`/api/shops/${shopId}/part-links/${linkId}`).set(csrf)).status).toBe(204);
    expect((await resolve(viewer, '73-3001')).body.current.map((c: { number: string }) => c.number)).toEqual(['73-3001']);
  });
});

describe('links and fitments', () => {
  it('links to a number not yet in the catalogue, and attaches it when the part is added', async () => {
    const from = await addPart(owner, shopId, 'LN-1');
    const linkId = await addLink(owner, shopId, { fromPartId: from, kind: 'replaced_by', toNumber: 'ln 2' });
    const to = await addPart(owner, shopId, 'LN-2');
    const detail = await owner.get(`/api/shops/${shopId}/parts/${from}`);
    expect(detail.body.linksFrom).toEqual([expect.objectContaining({ id: linkId, toPartId: to, toNumber: 'LN-2' })]);
  });

  it('validates links: both ends, self-links, equivalents with changes, duplicates', async () => {
    const from = ids['71-1000'];
    const both = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: from, kind: 'replaced_by', toPartId: ids['71-1001'], toNumber: 'X-1' });
    expect(both.status).toBe(400);
    expect(both.body.error.details[0].path).toEqual(['toPartId']);
    const eq = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: from, kind: 'equivalent', toNumber: 'X-1', interchange: 'with_changes' });
    expect(eq.body.error.details[0].path).toEqual(['interchange']);
    const self = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: from, kind: 'replaced_by', toPartId: from });
    expect(self.status).toBe(400);
    const dup = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: from, kind: 'replaced_by', toNumber: '71.1001' });
    expect(dup.status).toBe(409);
    const qty = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: from, kind: 'kit_contains', toNumber: 'X-2', quantity: 0 });
    expect(qty.body.error.details[0].path).toEqual(['quantity']);
  });

  it('updates and deletes a link and a fitment, audited', async () => {
    const linkId = await addLink(owner, shopId, { fromPartId: ids['74-4000'], kind: 'equivalent', toNumber: 'PT-4000' });
    const patched = await buyer.patch(`/api/shops/${shopId}/part-links/${linkId}`).set(csrf).send({ interchange: 'one_way', note: 'Thinner gasket' });
    expect(patched.status).toBe(200);
    expect(patched.body).toMatchObject({ interchange: 'one_way', note: 'Thinner gasket', toNumber: 'PT-4000' });
    const bad = await buyer.patch(`/api/shops/${shopId}/part-links/${linkId}`).set(csrf).send({ interchange: 'with_changes' });
    expect(bad.status).toBe(400);
    expect((await buyer.delete(`/api/shops/${shopId}/part-links/${linkId}`).set(csrf)).status).toBe(204);
    expect(await ctx.db.reader.count(PartLinkEntity, { where: { id: linkId } })).toBe(0);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { entityId: linkId } })).toBe(3);

    const created = await buyer.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: ids['74-4000'], marque: 'Astley-Pike', model: 'Kestrel', yearFrom: 1966, yearTo: 1970 });
    expect(created.status).toBe(201);
    const wrongYears = await buyer.patch(`/api/shops/${shopId}/fitments/${created.body.id}`).set(csrf).send({ yearTo: 1960 });
    expect(wrongYears.status).toBe(400);
    const fit = await buyer.patch(`/api/shops/${shopId}/fitments/${created.body.id}`).set(csrf).send({ frameFrom: 'AK 5001', frameTo: 'AK 9000' });
    expect(fit.body).toMatchObject({ frameFrom: 'AK 5001', frameTo: 'AK 9000', yearFrom: 1966 });
    expect((await buyer.delete(`/api/shops/${shopId}/fitments/${created.body.id}`).set(csrf)).status).toBe(204);
    expect(await ctx.db.reader.count(FitmentEntity, { where: { id: created.body.id } })).toBe(0);
    const badFit = await buyer.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: ids['74-4000'], marque: '', model: 'Kestrel', yearFrom: 1971, yearTo: 1970 });
    expect(badFit.status).toBe(400);
    expect(badFit.body.error.details.map((d: { path: string[] }) => d.path[0])).toEqual(expect.arrayContaining(['marque', 'yearTo']));
  });
});

describe('roles', () => {
  it('a viewer and a mechanic read but cannot edit (403)', async () => {
    for (const agent of [viewer, mechanic]) {
      expect((await agent.get(`/api/shops/${shopId}/parts/${ids['71-1000']}`)).status).toBe(200);
      expect((await agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number: 'RO-1', description: 'x' })).status).toBe(403);
      expect((await agent.patch(`/api/shops/${shopId}/parts/${ids['71-1000']}`).set(csrf).send({ description: 'x' })).status).toBe(403);
      expect((await agent.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: ids['71-1000'], kind: 'equivalent', toNumber: 'RO-2' })).status).toBe(403);
    }
    expect(await ctx.db.reader.count(PartEntity, { where: { shopId, number: 'RO-1' } })).toBe(0);
  });
});

describe('tenant isolation', () => {
  let foreignPart: string;
  beforeAll(async () => {
    foreignPart = await addPart(otherOwner, otherShopId, 'FOREIGN-1');
  });

  it('another shop part id in the URL is a 404', async () => {
    expect((await owner.get(`/api/shops/${shopId}/parts/${foreignPart}`)).status).toBe(404);
    expect((await owner.get(`/api/shops/${shopId}/parts/${foreignPart}/lineage`)).status).toBe(404);
    expect((await owner.patch(`/api/shops/${shopId}/parts/${foreignPart}`).set(csrf).send({ description: 'Taken' })).status).toBe(404);
    expect((await owner.get(`/api/shops/${otherShopId}/parts/${foreignPart}`)).status).toBe(404);
    expect((await resolve(owner, 'FOREIGN-1')).status).toBe(404);
  });

  it('another shop part id inside a body is a 404 and nothing is written', async () => {
    const before = await ctx.db.reader.count(PartLinkEntity);
    const fitmentsBefore = await ctx.db.reader.count(FitmentEntity);
    const asFrom = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: foreignPart, kind: 'replaced_by', toPartId: ids['71-1000'] });
    const asTo = await owner.post(`/api/shops/${shopId}/part-links`).set(csrf).send({ fromPartId: ids['71-1000'], kind: 'equivalent', toPartId: foreignPart });
    const asFitment = await owner.post(`/api/shops/${shopId}/fitments`).set(csrf).send({ partId: foreignPart, marque: 'Corran', model: 'Tern' });
    expect([asFrom.status, asTo.status, asFitment.status]).toEqual([404, 404, 404]);
    expect(await ctx.db.reader.count(PartLinkEntity)).toBe(before);
    expect(await ctx.db.reader.count(FitmentEntity)).toBe(fitmentsBefore);
  });

  it('another shop link and fitment ids are 404s; unknown ids too', async () => {
    const foreignOther = await addPart(otherOwner, otherShopId, 'FOREIGN-2');
    const foreignLink = await addLink(otherOwner, otherShopId, { fromPartId: foreignPart, kind: 'replaced_by', toPartId: foreignOther });
    expect((await owner.patch(`/api/shops/${shopId}/part-links/${foreignLink}`).set(csrf).send({ note: 'x' })).status).toBe(404);
    expect((await owner.delete(`/api/shops/${shopId}/part-links/${foreignLink}`).set(csrf)).status).toBe(404);
    expect(await ctx.db.reader.count(PartLinkEntity, { where: { id: foreignLink } })).toBe(1);
    expect((await owner.delete(`/api/shops/${shopId}/fitments/${randomUUID()}`).set(csrf)).status).toBe(404);
  });
});
