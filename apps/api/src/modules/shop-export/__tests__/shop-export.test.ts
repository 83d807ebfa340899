import fs from 'node:fs';
import path from 'node:path';
import AdmZip from 'adm-zip';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ShopEntity } from '../../shops/shops.entity';
import { shopOwnedTables, tableCsv } from '../shop-export.service';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let seeded: Awaited<ReturnType<typeof seedShop>>;
let owner: Awaited<ReturnType<typeof signedInAgent>>;
let url: string;

beforeEach(async () => {
  ctx = await createTestContext();
  seeded = await seedShop(ctx);
  owner = await signedInAgent(ctx.app, seeded.byRole.owner.email, seeded.password);
  url = `/api/shops/${seeded.shop.id}/export.zip`;
});
afterEach(() => ctx.close());

/** Downloads the zip as a buffer (supertest does not buffer binary bodies by itself). */
async function download(agent: ReturnType<typeof request.agent>) {
  const res = await agent
    .get(url)
    .buffer(true)
    .parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (c: Buffer) => chunks.push(c));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
  return res;
}

describe('shop export', () => {
  it('streams a zip with a CSV per shop-owned table, the uploads, and no secrets', async () => {
    // Something in each of this module's tables, secrets included.
    await owner.post(`/api/shops/${seeded.shop.id}/staff/invitations`).set(csrf).send({ email: 'kit.vale@harbour-works.test', role: 'viewer' }).expect(201);
    const { body: key } = await owner.post(`/api/shops/${seeded.shop.id}/api-keys`).set(csrf).send({ label: 'Feed', role: 'viewer' }).expect(201);
    await owner.patch(`/api/shops/${seeded.shop.id}/settings`).set(csrf).send({ pressureUnit: 'kPa' }).expect(200);
    const uploads = path.join(ctx.env.uploadsDir, seeded.shop.id, 'vehicles');
    fs.mkdirSync(uploads, { recursive: true });
    fs.writeFileSync(path.join(uploads, 'frame-plate.txt'), 'frame plate photo stand-in');
    // Another shop's data and uploads must not appear.
    const other = await seedShop(ctx, ['owner']);
    fs.mkdirSync(path.join(ctx.env.uploadsDir, other.shop.id), { recursive: true });
    fs.writeFileSync(path.join(ctx.env.uploadsDir, other.shop.id, 'theirs.txt'), 'not yours');

    const res = await download(owner);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="tappet-.*-export\.zip"/);
    const zip = new AdmZip(res.body as Buffer);
    const names = zip.getEntries().map((e) => e.entryName).sort();
    for (const table of ['memberships', 'invitations', 'api_keys', 'shop_settings', 'audit_events']) expect(names).toContain(`tables/${table}.csv`);
    expect(names).toContain('tables/shop.csv');
    expect(names).toContain('tables/users.csv');
    expect(names).toContain('uploads/vehicles/frame-plate.txt');
    expect(names).not.toContain('uploads/theirs.txt');
    expect(names.filter((n) => n.startsWith('tables/sessions') || n.startsWith('tables/password_reset'))).toEqual([]);

    const text = (name: string) => zip.readAsText(name);
    expect(text('uploads/vehicles/frame-plate.txt')).toBe('frame plate photo stand-in');
    expect(text('tables/memberships.csv').trim().split('\r\n')).toHaveLength(1 + 4);
    expect(text('tables/invitations.csv')).toContain('kit.vale@harbour-works.test');
    expect(text('tables/shop_settings.csv')).toContain('kPa');
    expect(text('tables/users.csv')).toContain(seeded.byRole.mechanic.email);
    const everything = zip.getEntries().map((e) => zip.readAsText(e)).join('\n');
    expect(everything).not.toMatch(/_hash|argon2|\$argon/);
    expect(everything).not.toContain(key.secret);
    expect(everything).not.toContain(other.shop.id);
    expect(text('tables/api_keys.csv').split('\r\n')[0]).not.toContain('secret');
  });

  it('is for owners only, refused to API keys, and another shop is a 404', async () => {
    for (const role of ['buyer', 'mechanic', 'viewer'] as const) {
      const agent = await signedInAgent(ctx.app, seeded.byRole[role].email, seeded.password);
      await agent.get(url).expect(403);
    }
    const { body: key } = await owner.post(`/api/shops/${seeded.shop.id}/api-keys`).set(csrf).send({ label: 'Feed', role: 'buyer' }).expect(201);
    await request(ctx.app).get(url).set({ Authorization: `Bearer ${key.secret}` }).expect(403);
    const other = await seedShop(ctx, ['owner']);
    const otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    await otherOwner.get(url).expect(404);
  });

  it('still works when the shop is suspended (read-only)', async () => {
    await ctx.db.write((m) => m.update(ShopEntity, { id: seeded.shop.id }, { billingState: 'suspended' }));
    await owner.patch(`/api/shops/${seeded.shop.id}/settings`).set(csrf).send({ pressureUnit: 'bar' }).expect(403);
    const res = await download(owner);
    expect(res.status).toBe(200);
    expect(new AdmZip(res.body as Buffer).getEntry('tables/shop.csv')).toBeTruthy();
  });

  it('finds every table with a shop_id column, and pages through a table in order', async () => {
    const tables = await shopOwnedTables(ctx.db);
    const names = tables.map((t) => t.name);
    expect(names).toEqual(expect.arrayContaining(['memberships', 'invitations', 'api_keys', 'shop_settings', 'audit_events']));
    expect(names).not.toContain('sessions');
    expect(tables.find((t) => t.name === 'invitations')!.columns).not.toContain('token_hash');
    const audit = tables.find((t) => t.name === 'audit_events')!;
    const chunks: string[] = [];
    for await (const chunk of tableCsv(ctx.db, audit, seeded.shop.id, 2)) chunks.push(chunk.toString());
    // Header, then pages of at most 2 rows: every audit event of the shop exactly once.
    expect(chunks.length).toBeGreaterThan(3);
    const ids = chunks.slice(1).flatMap((c) => c.trim().split('\r\n').map((line) => line.split(',')[0]));
    expect(new Set(ids).size).toBe(ids.length);
    const total = (await ctx.db.reader.query(`SELECT count(*) AS n FROM audit_events WHERE shop_id = ?`, [seeded.shop.id])) as Array<{ n: number }>;
    expect(ids).toHaveLength(Number(total[0]!.n));
  });
});
