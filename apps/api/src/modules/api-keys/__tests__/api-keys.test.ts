import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { MembershipEntity } from '../../shops/shops.entity';
import { ApiKeyEntity } from '../api-keys.entity';
import { hashApiKeySecret } from '../api-keys.service';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let seeded: Awaited<ReturnType<typeof seedShop>>;
let owner: Awaited<ReturnType<typeof signedInAgent>>;
let base: string;

beforeEach(async () => {
  ctx = await createTestContext();
  seeded = await seedShop(ctx);
  owner = await signedInAgent(ctx.app, seeded.byRole.owner.email, seeded.password);
  base = `/api/shops/${seeded.shop.id}/api-keys`;
});
afterEach(() => ctx.close());

async function createKey(body: Record<string, unknown> = { label: 'Stock feed', role: 'viewer' }) {
  const res = await owner.post(base).set(csrf).send(body).expect(201);
  return res.body as { key: { id: string; label: string; role: string }; secret: string };
}

const bearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });

describe('API keys', () => {
  it('returns the secret once, stores only its SHA-256 and never lists it', async () => {
    const { key, secret } = await createKey({ label: 'Bench scanner', role: 'buyer', integrationName: 'Parts counter tablet' });
    expect(secret).toMatch(/^tpk_[A-Za-z0-9_-]{43}$/);
    const row = await ctx.db.reader.findOneOrFail(ApiKeyEntity, { where: { id: key.id } });
    expect(row.secretHash).toBe(hashApiKeySecret(secret));
    expect(row).toMatchObject({ integrationName: 'Parts counter tablet', boundUserId: null, createdByUserId: seeded.byRole.owner.id });
    const list = await owner.get(base).expect(200);
    expect(list.body.keys).toEqual([expect.objectContaining({ id: key.id, label: 'Bench scanner', role: 'buyer', integrationName: 'Parts counter tablet', lastUsedAt: null, revokedAt: null, createdBy: { id: seeded.byRole.owner.id, name: seeded.byRole.owner.name } })]);
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(4));
    expect(JSON.stringify(list.body)).not.toMatch(/hash/i);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { action: 'api_key.created', entityId: key.id } })).toBe(1);
  });

  it('refuses roles above buyer and unknown fields', async () => {
    await owner.post(base).set(csrf).send({ label: 'x', role: 'owner' }).expect(400);
    await owner.post(base).set(csrf).send({ label: 'x', role: 'mechanic' }).expect(400);
    await owner.post(base).set(csrf).send({ label: 'x', role: 'viewer', secretHash: 'a' }).expect(400);
  });

  it('is managed by owners only', async () => {
    const buyer = await signedInAgent(ctx.app, seeded.byRole.buyer.email, seeded.password);
    await buyer.get(base).expect(403);
    await buyer.post(base).set(csrf).send({ label: 'x', role: 'viewer' }).expect(403);
  });

  it('authenticates a Bearer key in its own shop, with its role, without a CSRF header', async () => {
    const { key, secret } = await createKey({ label: 'Buyer key', role: 'buyer' });
    const res = await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
    expect(res.body.id).toBe(seeded.shop.id);
    // Buyer role: may not rename the shop (403, not a CSRF refusal).
    const write = await request(ctx.app).patch(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).send({ name: 'Renamed by key' }).expect(403);
    expect(write.body.error.code).toBe('forbidden');
    const row = await ctx.db.reader.findOneOrFail(ApiKeyEntity, { where: { id: key.id } });
    expect(row.lastUsedAt?.getTime()).toBe(ctx.clock.now().getTime());
  });

  it('never manages staff, keys, settings, the audit log or the export (403)', async () => {
    const { secret } = await createKey({ label: 'Viewer key', role: 'viewer' });
    const shop = `/api/shops/${seeded.shop.id}`;
    await request(ctx.app).get(`${shop}/staff`).set(bearer(secret)).expect(403);
    await request(ctx.app).post(`${shop}/staff/invitations`).set(bearer(secret)).send({ email: 'k@harbour-works.test', role: 'owner' }).expect(403);
    await request(ctx.app).post(`${shop}/api-keys`).set(bearer(secret)).send({ label: 'more', role: 'buyer' }).expect(403);
    await request(ctx.app).get(`${shop}/api-keys`).set(bearer(secret)).expect(403);
  });

  it('acts only in its own shop: another shop is a 404, and personal routes refuse it', async () => {
    const other = await seedShop(ctx, ['owner']);
    const { secret } = await createKey();
    await request(ctx.app).get(`/api/shops/${other.shop.id}`).set(bearer(secret)).expect(404);
    await request(ctx.app).get('/api/me').set(bearer(secret)).expect(401);
    await request(ctx.app).get('/api/shops').set(bearer(secret)).expect(401);
  });

  it('a buyer key writes the catalogue, and the audit log names the key', async () => {
    const { key, secret } = await createKey({ label: 'Supplier feed', role: 'buyer', integrationName: 'Price list sync' });
    const res = await request(ctx.app)
      .post(`/api/shops/${seeded.shop.id}/parts`)
      .set(bearer(secret))
      .set('Content-Type', 'application/json')
      .send({ number: '82-1190', description: 'Float needle valve' });
    expect(res.status).toBe(201);
    const events = await ctx.db.reader.find(AuditEventEntity, { where: { shopId: seeded.shop.id, entityId: res.body.id } });
    expect(events.length).toBeGreaterThan(0);
    expect(events[0]).toMatchObject({ actorApiKeyId: key.id });
  });

  it('answers 401 for a revoked or unknown key', async () => {
    const { key, secret } = await createKey();
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
    const revoked = await owner.post(`${base}/${key.id}/revoke`).set(csrf).expect(200);
    expect(revoked.body.revokedAt).toBe(ctx.clock.now().toISOString());
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(401);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(`tpk_${'x'.repeat(43)}`)).expect(401);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { action: 'api_key.revoked', entityId: key.id } })).toBe(1);
  });

  it('stops working when the owner it acts for is deactivated', async () => {
    // Make the seeded viewer a second owner, who then creates a key and is deactivated.
    const viewerMembership = await ctx.db.reader.findOneOrFail(MembershipEntity, { where: { shopId: seeded.shop.id, userId: seeded.byRole.viewer.id } });
    await owner.patch(`/api/shops/${seeded.shop.id}/staff/${viewerMembership.id}/role`).set(csrf).send({ role: 'owner' }).expect(200);
    const coOwner = await signedInAgent(ctx.app, seeded.byRole.viewer.email, seeded.password);
    const { body } = await coOwner.post(base).set(csrf).send({ label: 'Personal', role: 'viewer' }).expect(201);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(body.secret)).expect(200);
    await owner.post(`/api/shops/${seeded.shop.id}/staff/${viewerMembership.id}/deactivate`).set(csrf).expect(200);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(body.secret)).expect(401);
  });

  it('writes last_used_at at most once a minute', async () => {
    const { key, secret } = await createKey();
    const first = ctx.clock.now().getTime();
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
    ctx.clock.advance(30_000);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
    expect((await ctx.db.reader.findOneOrFail(ApiKeyEntity, { where: { id: key.id } })).lastUsedAt?.getTime()).toBe(first);
    ctx.clock.advance(31_000);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
    expect((await ctx.db.reader.findOneOrFail(ApiKeyEntity, { where: { id: key.id } })).lastUsedAt?.getTime()).toBe(first + 61_000);
  });

  it('still needs the CSRF header when a cookie comes along with the key', async () => {
    const { secret } = await createKey({ label: 'Buyer key', role: 'buyer' });
    const res = await owner.patch(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).send({ name: 'Nope' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_rejected');
  });

  it('wants a JSON body from key requests, as from the app', async () => {
    const { secret } = await createKey({ label: 'Buyer key', role: 'buyer' });
    const res = await request(ctx.app).patch(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).set('Content-Type', 'text/plain').send('name=x');
    expect(res.status).toBe(415);
  });

  it('cannot be bound to a person of another shop: the database refuses it', async () => {
    const other = await seedShop(ctx, ['owner']);
    const row = { id: randomUUID(), shopId: seeded.shop.id, label: 'Cross', role: 'viewer' as const, secretHash: 'f'.repeat(64), createdByUserId: seeded.byRole.owner.id, boundUserId: other.byRole.owner.id, integrationName: null, createdAt: ctx.clock.now(), lastUsedAt: null, revokedAt: null };
    await expect(ctx.db.write((m) => m.insert(ApiKeyEntity, row))).rejects.toThrow(/foreign key/i);
  });

  it('revoking a key of another shop is a 404', async () => {
    const other = await seedShop(ctx, ['owner']);
    const otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    const { key, secret } = await createKey();
    await otherOwner.post(`/api/shops/${other.shop.id}/api-keys/${key.id}/revoke`).set(csrf).expect(404);
    await request(ctx.app).get(`/api/shops/${seeded.shop.id}`).set(bearer(secret)).expect(200);
  });
});
