import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { ListingEntity } from '../purchasing.entity';
import { addPart, addSupplier, post, type Agent } from './helpers';

let ctx: TestContext;
let owner: Agent;
let buyer: Agent;
let viewer: Agent;
let shopId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
});
afterAll(() => ctx.close());

const importListings = (agent: Agent, mode: string, csv: string) =>
  agent.post(`/api/shops/${shopId}/purchasing/listings/import`).set(csrf).field('mode', mode).attach('file', Buffer.from(csv, 'utf8'), 'listings.csv');

describe('suppliers', () => {
  it('are kept by buyers, read by viewers, unique by name, audited', async () => {
    const created = await post(buyer, shopId, '/suppliers', { name: 'Hollin Pattern Co.', email: 'Sales@Hollin-Pattern.test', currency: 'gbp', leadTimeDays: 10, leadTimeSdDays: 2.5, minOrderValueMinor: 10_000 }, 201);
    expect(created).toMatchObject({ name: 'Hollin Pattern Co.', email: 'sales@hollin-pattern.test', currency: 'GBP', leadTimeDays: 10, leadTimeSdDays: 2.5, minOrderValueMinor: 10_000, active: true, listingCount: 0 });
    const twice = await buyer.post(`/api/shops/${shopId}/purchasing/suppliers`).set(csrf).send({ name: 'hollin  pattern co.', currency: 'GBP', leadTimeDays: 1 });
    expect(twice.status).toBe(409);
    expect((await viewer.post(`/api/shops/${shopId}/purchasing/suppliers`).set(csrf).send({ name: 'Viewer Co', currency: 'GBP', leadTimeDays: 1 })).status).toBe(403);
    expect((await viewer.get(`/api/shops/${shopId}/purchasing/suppliers`)).body.suppliers.map((s: { name: string }) => s.name)).toContain('Hollin Pattern Co.');
    const patched = await buyer.patch(`/api/shops/${shopId}/purchasing/suppliers/${created.id}`).set(csrf).send({ leadTimeDays: 12 });
    expect(patched.body.leadTimeDays).toBe(12);
    const audit = await ctx.db.reader.find(AuditEventEntity, { where: { shopId, entity: 'supplier', entityId: created.id } });
    expect(audit.map((a) => a.action).sort()).toEqual(['supplier.created', 'supplier.updated']);
    expect(audit.find((a) => a.action === 'supplier.updated')?.changes).toEqual({ leadTimeDays: { before: 10, after: 12 } });
  });

  it('refuses bad input field by field, and unknown fields', async () => {
    const res = await buyer.post(`/api/shops/${shopId}/purchasing/suppliers`).set(csrf).send({ name: 'X', currency: 'ZZZ', leadTimeDays: -1, email: 'nope', shopId: 'x' });
    expect(res.status).toBe(400);
    const fields = (res.body.error.details as Array<{ path: string[] }>).map((d) => d.path.join('.')).sort();
    expect(fields).toEqual(expect.arrayContaining(['currency', 'email', 'leadTimeDays', 'name']));
  });
});

describe('listings and per-part choices', () => {
  it('lists a part at a supplier once, sets the preferred supplier and a manual min/max', async () => {
    const supplierId = await addSupplier(buyer, shopId);
    const partId = await addPart(owner, shopId, 'LP-100');
    const listing = await post(buyer, shopId, `/suppliers/${supplierId}/listings`, { partId, supplierNumber: 'X-100', priceMinor: 450, packSize: 10, minOrderQty: 20, leadTimeDays: 3 }, 201);
    expect(listing).toMatchObject({ partNumber: 'LP-100', packSize: 10, minOrderQty: 20, leadTimeDays: 3, preferred: false });
    expect((await buyer.post(`/api/shops/${shopId}/purchasing/suppliers/${supplierId}/listings`).set(csrf).send({ partId, priceMinor: 1 })).status).toBe(409);
    const set = await buyer.put(`/api/shops/${shopId}/purchasing/parts/${partId}`).set(csrf).send({ preferredSupplierId: supplierId, minQty: 2, maxQty: 8 });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body).toMatchObject({ preferredSupplierId: supplierId, minQty: 2, maxQty: 8, listings: [{ id: listing.id, preferred: true }] });
    const wrong = await buyer.put(`/api/shops/${shopId}/purchasing/parts/${partId}`).set(csrf).send({ preferredSupplierId: null, minQty: 9, maxQty: 8 });
    expect(wrong.status).toBe(400);
    const changed = await buyer.patch(`/api/shops/${shopId}/purchasing/listings/${listing.id}`).set(csrf).send({ priceMinor: 475 });
    // Fields left out of a change keep their values.
    expect(changed.body).toMatchObject({ priceMinor: 475, packSize: 10, minOrderQty: 20, leadTimeDays: 3, supplierNumber: 'X-100' });
    expect((await buyer.delete(`/api/shops/${shopId}/purchasing/listings/${listing.id}`).set(csrf)).status).toBe(204);
    expect(await ctx.db.reader.count(ListingEntity, { where: { shopId, id: listing.id } })).toBe(0);
  });
});

describe('listings CSV import', () => {
  it('previews without writing, reports row errors and commits all or nothing', async () => {
    await post(owner, shopId, '/suppliers', { name: 'Tarnwell Reproductions', email: 'trade@tarnwell.test', currency: 'EUR', leadTimeDays: 21 }, 201);
    const a = await addPart(owner, shopId, 'TW-1', { supplierNumbers: ['TR 0001'] });
    const b = await addPart(owner, shopId, 'TW-2');
    const bad = 'supplier;part_number;supplier_number;price;pack_size\r\nTarnwell Reproductions;TR 0001;TR 0001;"12,50";5\r\nTarnwell Reproductions;TW-2;;12.505;1\r\nNobody Ltd;TW-9;;1;0\r\n';
    const preview = await importListings(buyer, 'commit', bad);
    expect(preview.status, JSON.stringify(preview.body)).toBe(200);
    expect(preview.body).toMatchObject({ rows: 3, added: 1, committed: false });
    expect(preview.body.errors).toEqual([
      { row: 3, column: 'price', message: 'Write the price in EUR like 12.50 (at most 2 decimals).' },
      { row: 4, column: 'pack_size', message: 'The pack size must be at least 1.' },
    ]);
    expect(await ctx.db.reader.count(ListingEntity, { where: { shopId, partId: a } })).toBe(0);

    const good = 'supplier,part_number,supplier_number,price,pack_size,min_order_qty\nTarnwell Reproductions,TR 0001,TR 0001,"12,50",5,10\nTarnwell Reproductions,TW-2,,3.20,1,0\n';
    expect((await importListings(buyer, 'preview', good)).body).toMatchObject({ added: 2, committed: false, errors: [] });
    expect((await importListings(buyer, 'commit', good)).body).toMatchObject({ added: 2, committed: true });
    const rows = await ctx.db.reader.find(ListingEntity, { where: { shopId }, order: { priceMinor: 'ASC' } });
    expect(rows.filter((r) => r.partId === a || r.partId === b).map((r) => [r.priceMinor, r.packSize, r.minOrderQty])).toEqual([
      [320, 1, 0],
      [1250, 5, 10],
    ]);
    const again = await importListings(buyer, 'commit', 'supplier,part_number,price\nTarnwell Reproductions,TW-2,3.40\n');
    expect(again.body).toMatchObject({ changed: 1, committed: true, sample: [{ action: 'change', summary: 'Tarnwell Reproductions: TW-2: priceMinor' }] });
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { shopId, action: 'supplier_listings.imported' } })).toBe(2);
    expect((await importListings(viewer, 'preview', good)).status).toBe(403);
    expect((await importListings(buyer, 'preview', 'supplier,part\nx,y\n')).status).toBe(400);
  });
});
