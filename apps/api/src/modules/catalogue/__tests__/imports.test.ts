import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createShopWithUsers } from '../../test-support/test-support.service';
import { AuditEventEntity } from '../../audit/audit.entity';
import { FitmentEntity, PartEntity, PartLinkEntity } from '../catalogue.entity';
import { addPart, importCsv, type Agent } from './helpers';

let ctx: TestContext;
let owner: Agent;
let viewer: Agent;
let buyer: Agent;
let password: string;
let ownerEmail: string;

/** A fresh shop owned by the test's owner-like user; returns the shop id and a signed-in agent. */
async function newShop(): Promise<{ shopId: string; agent: Agent }> {
  const created = await createShopWithUsers(ctx.db, ctx.clock, { roles: ['owner'] });
  return { shopId: created.shop.id, agent: await signedInAgent(ctx.app, created.users[0]!.email, created.password) };
}

let shopId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  password = shop.password;
  ownerEmail = shop.byRole.owner.email;
  owner = await signedInAgent(ctx.app, ownerEmail, password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, password);
});
afterAll(() => ctx.close());

const partsOf = (id: string) => ctx.db.reader.find(PartEntity, { where: { shopId: id }, order: { key: 'ASC' } });

describe('importing good files', () => {
  it('reads a semicolon file with a BOM, quotes, CRLF and leading zeros; preview writes nothing, commit writes all', async () => {
    const { shopId: id, agent } = await newShop();
    const csv = '\ufeffnumber;description;origin;supplier_numbers;notes\r\n' + '007-12;"Gasket; head";genuine;"AB 1; AB-2";"Says ""fit dry"""\r\n' + '0100;Washer, plain;pattern;;\r\n';
    const preview = await importCsv(agent, id, 'parts', 'preview', csv);
    expect(preview.status, JSON.stringify(preview.body)).toBe(200);
    expect(preview.body).toMatchObject({ rows: 2, added: 2, changed: 0, unchanged: 0, errors: [], committed: false });
    expect(preview.body.sample).toEqual([
      { row: 2, action: 'add', summary: '007-12 Gasket; head' },
      { row: 3, action: 'add', summary: '0100 Washer, plain' },
    ]);
    expect(await partsOf(id)).toEqual([]);

    const commit = await importCsv(agent, id, 'parts', 'commit', csv);
    expect(commit.body).toMatchObject({ added: 2, committed: true });
    const parts = await partsOf(id);
    expect(parts.map((p) => [p.number, p.key, p.description, p.origin, p.notes])).toEqual([
      ['007-12', '00712', 'Gasket; head', 'genuine', 'Says "fit dry"'],
      ['0100', '0100', 'Washer, plain', 'pattern', null],
    ]);
    const detail = await agent.get(`/api/shops/${id}/lineage/resolve`).query({ number: 'AB2' });
    expect(detail.body.part.supplierNumbers).toEqual(['AB 1', 'AB-2']);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { shopId: id, action: 'catalogue.imported' } })).toBe(1);

    // The same file again changes nothing; a changed description is a change, only of the columns given.
    const again = await importCsv(agent, id, 'parts', 'preview', csv);
    expect(again.body).toMatchObject({ added: 0, changed: 0, unchanged: 2 });
    const change = await importCsv(agent, id, 'parts', 'commit', 'number,description\n0100,Washer (plain)\n');
    expect(change.body).toMatchObject({ added: 0, changed: 1, committed: true });
    expect(change.body.sample).toEqual([{ row: 2, action: 'change', summary: '0100: description' }]);
    const washer = (await partsOf(id)).find((p) => p.number === '0100');
    expect(washer).toMatchObject({ description: 'Washer (plain)', origin: 'pattern' });
  });

  it('imports links and fitments against the catalogue', async () => {
    const { shopId: id, agent } = await newShop();
    await importCsv(agent, id, 'parts', 'commit', 'number,description\nA-1,Old\nA-2,New\nA-3,Kit\n');
    const links = 'from_number,kind,to_number,quantity,interchange,effective_date,source_reference,note\nA-1,replaced_by,A-2,"1,5",one_way,1972-05-01,SB 7,\nA-3,kit_contains,A-1,2,,,,\nA-2,equivalent,QX-9,,,,,Not stocked\n';
    const res = await importCsv(agent, id, 'links', 'commit', links);
    expect(res.body).toMatchObject({ rows: 3, added: 3, errors: [], committed: true });
    const resolved = await agent.get(`/api/shops/${id}/lineage/resolve`).query({ number: 'a1' });
    expect(resolved.body.current).toEqual([expect.objectContaining({ number: 'A-2', quantity: 1.5 })]);
    const fits = await importCsv(agent, id, 'fitments', 'commit', 'number,marque,model,year_from,year_to,frame_from,frame_to\nA-2,Corran,Tern 350,1968,1971,CT 100,\nA-2,Corran,Tern 500,,,,\n');
    expect(fits.body).toMatchObject({ added: 2, committed: true });
    expect(await ctx.db.reader.count(FitmentEntity, { where: { shopId: id } })).toBe(2);
  });
});

describe('bad rows and bad files', () => {
  it('reports every bad row with its row number, column and a plain message, and commits nothing', async () => {
    const { shopId: id, agent } = await newShop();
    const csv = [
      'number,description,origin,status',
      'G-1,Good part,genuine,available',
      ',No number,genuine,available',
      'G-3,,genuine,available',
      'G-4,Bad origin,aftermarket,available',
      'G-5,Bad status,genuine,gone',
      'g 1,Same number as row 2,genuine,available',
      'G-7,Too few cells',
      'G#8,Bad characters,genuine,available',
    ].join('\r\n');
    const res = await importCsv(agent, id, 'parts', 'commit', csv);
    expect(res.status).toBe(200);
    expect(res.body.committed).toBe(false);
    const errors = res.body.errors as Array<{ row: number; column: string | null; message: string }>;
    expect(errors.map((e) => [e.row, e.column])).toEqual([
      [3, 'number'],
      [4, 'description'],
      [5, 'origin'],
      [6, 'status'],
      [7, 'number'],
      [8, null],
      [9, 'number'],
    ]);
    expect(errors[0]!.message).toBe('Enter the part number.');
    expect(errors[4]!.message).toMatch(/row 2/);
    expect(errors[5]!.message).toMatch(/2 cells; the header has 4/);
    expect(await partsOf(id)).toEqual([]);
  });

  it('reports bad link and fitment rows', async () => {
    const { shopId: id, agent } = await newShop();
    await importCsv(agent, id, 'parts', 'commit', 'number,description\nB-1,One\nB-2,Two\n');
    const links = await importCsv(agent, id, 'links', 'commit', 'from_number,kind,to_number,quantity,interchange,effective_date\nB-1,replaced_by,B-2,1,both,\nZZ-1,replaced_by,B-2,,,\nB-1,swapped,B-2,,,\nB-1,kit_contains,B-2,0,,\nB-1,equivalent,B-2,,with_changes,\nB-1,replaced_by,B-2,,,1972-13-01\nB-2,replaced_by,b2,,,\n');
    expect(links.body.errors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
      [3, 'from_number'],
      [4, 'kind'],
      [5, 'quantity'],
      [6, 'interchange'],
      [7, 'effective_date'],
      [8, 'to_number'],
    ]);
    expect(links.body.committed).toBe(false);
    expect(await ctx.db.reader.count(PartLinkEntity, { where: { shopId: id } })).toBe(0);
    const fits = await importCsv(agent, id, 'fitments', 'preview', 'number,marque,model,year_from,year_to\nB-1,Corran,Tern,1970,1969\nB-9,Corran,Tern,,\nB-1,,Tern,,\nB-1,Corran,Tern,70,\n');
    expect(fits.body.errors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
      [2, 'year_to'],
      [3, 'number'],
      [4, 'marque'],
      [5, 'year_from'],
    ]);
  });

  it('a file with one bad row among good ones commits nothing, links and updates included', async () => {
    const { shopId: id, agent } = await newShop();
    await importCsv(agent, id, 'parts', 'commit', 'number,description\nC-1,Kept as it was\n');
    const res = await importCsv(agent, id, 'parts', 'commit', 'number,description,status\nC-1,Changed,available\nC-2,New one,available\nC-3,Bad one,sold\nC-4,New too,nla\n');
    expect(res.body).toMatchObject({ added: 2, changed: 1, committed: false, errors: [{ row: 4, column: 'status' }] });
    expect((await partsOf(id)).map((p) => [p.number, p.description])).toEqual([['C-1', 'Kept as it was']]);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { shopId: id, action: 'catalogue.imported' } })).toBe(1);
  });

  it('a missing required column is a 400 naming it; an unknown column too', async () => {
    const missing = await importCsv(owner, shopId, 'parts', 'preview', 'number,notes\nX-1,hello\n');
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/"description"/);
    const unknown = await importCsv(owner, shopId, 'parts', 'preview', 'number,description,colour\nX-1,a,red\n');
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/"colour"/);
  });

  it('refuses binary and non-UTF-8 files with a clear 415', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]);
    const bin = await importCsv(owner, shopId, 'parts', 'preview', png, 'photo.png');
    expect(bin.status).toBe(415);
    expect(bin.body.error.message).toMatch(/not a CSV text file/);
    const latin1 = await importCsv(owner, shopId, 'parts', 'preview', Buffer.from('number,description\nX-1,Kupplungsscheibe f\xfcr\n', 'latin1'));
    expect(latin1.status).toBe(415);
    expect(latin1.body.error.message).toMatch(/UTF-8/);
  });

  it('reports a quote that is never closed as an error on its row, and commits nothing', async () => {
    const { shopId: id, agent } = await newShop();
    const res = await importCsv(agent, id, 'parts', 'commit', 'number,description\nQ-1,Fine\nQ-2,"Never closed\nQ-3,Lost\n');
    expect(res.body.committed).toBe(false);
    expect(res.body.errors).toEqual([{ row: 3, column: null, message: expect.stringMatching(/quoted cell is not closed/) }]);
    expect(await partsOf(id)).toEqual([]);
  });

  it('accepts multipart only on the import route', async () => {
    const res = await owner.post(`/api/shops/${shopId}/parts`).set(csrf).field('number', 'MP-1').field('description', 'Multipart');
    expect(res.status).toBe(415);
  });

  it('refuses a file over 20 MB with 413', async () => {
    const big = Buffer.alloc(20 * 1024 * 1024 + 1, 'a');
    const res = await importCsv(owner, shopId, 'parts', 'preview', big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('needs the file, kind and mode', async () => {
    const noFile = await owner.post(`/api/shops/${shopId}/imports`).set(csrf).field('kind', 'parts').field('mode', 'preview');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.message).toMatch(/file/);
    const badKind = await importCsv(owner, shopId, 'vehicles', 'preview', 'number,description\n');
    expect(badKind.status).toBe(400);
    expect(badKind.body.error.details[0].path).toEqual(['kind']);
  });

  it('a viewer cannot import (403), a buyer can', async () => {
    const csv = 'number,description\nVW-1,Viewer part\n';
    expect((await importCsv(viewer, shopId, 'parts', 'commit', csv)).status).toBe(403);
    expect(await ctx.db.reader.count(PartEntity, { where: { shopId, number: 'VW-1' } })).toBe(0);
    expect((await importCsv(buyer, shopId, 'parts', 'commit', csv)).body.committed).toBe(true);
  });
});

describe('export and round trip', () => {
  it('exports a shop and imports it into a new shop with every field equal', async () => {
    const { shopId: source, agent } = await newShop();
    await addPart(agent, source, '0001-A', { description: 'Clutch plate', origin: 'reproduction', maker: 'Quillan & Sons', category: 'Clutch', unit: 'set', status: 'nla', notes: '=HYPERLINK("x") cell, with "quotes"\nand a line', supplierNumbers: ['-5 SPEC', 'QS 11'] });
    await addPart(agent, source, '0002', { description: '+ Spring', notes: "'=already guarded" });
    await addPart(agent, source, '0003', { description: '@mention' });
    const ids = await partsOf(source);
    const [a, b] = [ids[0]!, ids[1]!];
    await agent.post(`/api/shops/${source}/part-links`).set(csrf).send({ fromPartId: a.id, kind: 'replaced_by', toPartId: b.id, quantity: 0.5, interchange: 'with_changes', effectiveDate: '1973-02-01', sourceReference: 'SB-44', note: '-see bulletin' });
    await agent.post(`/api/shops/${source}/part-links`).set(csrf).send({ fromPartId: b.id, kind: 'equivalent', toNumber: 'QS 9', interchange: 'one_way' });
    await agent.post(`/api/shops/${source}/fitments`).set(csrf).send({ partId: a.id, marque: 'Velmark', model: 'Sprite 250', yearFrom: 1967, yearTo: 1969, frameFrom: 'VS 0100', frameTo: 'VS 4999' });
    await agent.post(`/api/shops/${source}/fitments`).set(csrf).send({ partId: b.id, marque: 'Velmark', model: 'Sprite 250' });

    const exported: Record<string, string> = {};
    for (const kind of ['parts', 'links', 'fitments']) {
      const res = await agent.get(`/api/shops/${source}/exports/${kind}.csv`).buffer(true).parse((r, cb) => {
        let data = '';
        r.on('data', (c: Buffer) => (data += c.toString('utf8')));
        r.on('end', () => cb(null, data));
      });
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/text\/csv/);
      exported[kind] = res.body as string;
    }
    expect(exported['parts']).toContain(`"'=HYPERLINK(""x"") cell`);
    expect(exported['parts']).toContain("'+ Spring");
    expect(exported['parts']).toContain("''=already guarded");

    const { shopId: target, agent: targetAgent } = await newShop();
    for (const kind of ['parts', 'links', 'fitments']) {
      const res = await importCsv(targetAgent, target, kind, 'commit', exported[kind]!);
      expect(res.body.errors, kind).toEqual([]);
      expect(res.body.committed, kind).toBe(true);
    }
    const view = async (shop: string, who: Agent) => {
      const parts = await partsOf(shop);
      const details = await Promise.all(parts.map((p) => who.get(`/api/shops/${shop}/parts/${p.id}`)));
      return details.map((d) => {
        const { part, linksFrom, fitments } = d.body;
        const { id: _i, createdAt: _c, updatedAt: _u, ...fields } = part;
        return {
          fields,
          links: linksFrom.map(({ id: _l, fromPartId: _f, toPartId, ...l }: Record<string, unknown>) => ({ ...l, toKnown: toPartId !== null })),
          fitments: fitments.map(({ id: _f, partId: _p, ...f }: Record<string, unknown>) => f),
        };
      });
    };
    const before = await view(source, agent);
    const after = await view(target, targetAgent);
    expect(after).toEqual(before);
    expect(before[0]!.fields.notes).toBe('=HYPERLINK("x") cell, with "quotes"\nand a line');
    expect(before[1]!.fields.notes).toBe("'=already guarded");
    expect(before[0]!.links[0]).toMatchObject({ quantity: 0.5, interchange: 'with_changes', effectiveDate: '1973-02-01', note: '-see bulletin' });
  });
});

describe('a large file', () => {
  it('imports 100,000 parts in one commit', { timeout: 120_000 }, async () => {
    const { shopId: id, agent } = await newShop();
    const lines = ['number,description,category'];
    for (let i = 0; i < 100_000; i++) lines.push(`LG-${String(i).padStart(6, '0')},Generated part ${i},Bulk`);
    const res = await importCsv(agent, id, 'parts', 'commit', lines.join('\n'));
    expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(200);
    expect(res.body).toMatchObject({ rows: 100_000, added: 100_000, committed: true, errors: [] });
    expect(res.body.sample).toHaveLength(50);
    expect(await ctx.db.reader.count(PartEntity, { where: { shopId: id } })).toBe(100_000);
    const found = await agent.get(`/api/shops/${id}/lineage/resolve`).query({ number: 'lg099999' });
    expect(found.body.part.description).toBe('Generated part 99999');
  });
});
