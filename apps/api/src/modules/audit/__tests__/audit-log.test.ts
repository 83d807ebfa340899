import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { csvCell } from '../csv';
import { recordAudit } from '../audit.service';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let seeded: Awaited<ReturnType<typeof seedShop>>;
let owner: Awaited<ReturnType<typeof signedInAgent>>;
let base: string;

beforeEach(async () => {
  ctx = await createTestContext();
  seeded = await seedShop(ctx);
  owner = await signedInAgent(ctx.app, seeded.byRole.owner.email, seeded.password);
  base = `/api/shops/${seeded.shop.id}`;
});
afterEach(() => ctx.close());

/** Splits simple CSV (quoted cells, CRLF) into rows of cells. */
function parseCsv(text: string): string[][] {
  return text
    .split('\r\n')
    .filter(Boolean)
    .map((line) => [...line.matchAll(/"((?:[^"]|"")*)"/g)].map((m) => (m[1] ?? '').replace(/""/g, '"')));
}

describe('audit log', () => {
  it('lists the shop\'s events newest first, with who did them, and filters by actor, entity and date', async () => {
    const day1 = ctx.clock.now();
    await owner.patch(base).set(csrf).send({ name: 'Harbour Works Renamed' }).expect(200);
    ctx.clock.advance(24 * 3600_000);
    owner = await signedInAgent(ctx.app, seeded.byRole.owner.email, seeded.password); // the old session idled out
    const { body: key } = await owner.post(`${base}/api-keys`).set(csrf).send({ label: 'Feed', role: 'viewer' }).expect(201);
    ctx.clock.advance(1000); // so that the invitation is the newest event
    await owner.post(`${base}/staff/invitations`).set(csrf).send({ email: 'pat.reed@harbour-works.test', role: 'viewer' }).expect(201);

    const all = await owner.get(`${base}/audit-events`).expect(200);
    expect(all.body.total).toBeGreaterThanOrEqual(3);
    expect(all.body.events[0].action).toBe('invitation.created');
    expect(all.body.events[0].actor).toMatchObject({ userId: seeded.byRole.owner.id, userName: seeded.byRole.owner.name, apiKeyId: null });

    const shops = await owner.get(`${base}/audit-events`).query({ entity: 'shop' }).expect(200);
    expect(shops.body.events.map((e: { action: string }) => e.action)).toContain('shop.updated');
    expect(shops.body.events.every((e: { entity: string }) => e.entity === 'shop')).toBe(true);
    const renamed = shops.body.events.find((e: { action: string }) => e.action === 'shop.updated');
    expect(renamed.changes.name).toEqual({ before: seeded.shop.name, after: 'Harbour Works Renamed' });

    const day1Date = day1.toISOString().slice(0, 10);
    const onDay1 = await owner.get(`${base}/audit-events`).query({ from: day1Date, to: day1Date }).expect(200);
    expect(onDay1.body.events.map((e: { action: string }) => e.action)).toContain('shop.updated');
    expect(onDay1.body.events.map((e: { action: string }) => e.action)).not.toContain('api_key.created');
    const afterDay1 = await owner.get(`${base}/audit-events`).query({ from: new Date(day1.getTime() + 3600_000).toISOString() }).expect(200);
    expect(afterDay1.body.events.map((e: { action: string }) => e.action).sort()).toEqual(['api_key.created', 'invitation.created']);

    const byViewer = await owner.get(`${base}/audit-events`).query({ actor: seeded.byRole.viewer.id }).expect(200);
    expect(byViewer.body.events.every((e: { actor: { userId: string } }) => e.actor.userId === seeded.byRole.viewer.id)).toBe(true);
    expect(key.key.id).toBeTruthy();
  });

  it('filters by API key and names the key', async () => {
    const { body } = await owner.post(`${base}/api-keys`).set(csrf).send({ label: 'Owner script', role: 'buyer' }).expect(201);
    // A refused write by the key records nothing.
    await request(ctx.app).patch(base).set({ Authorization: `Bearer ${body.secret}` }).send({ name: 'Nope' }).expect(403);
    expect((await owner.get(`${base}/audit-events`).query({ actor: body.key.id }).expect(200)).body.events).toEqual([]);
    // No route a key may write to exists yet: record one as a later module would.
    await ctx.db.write((m) => recordAudit(m, { shopId: seeded.shop.id, actor: { userId: seeded.byRole.owner.id, apiKeyId: body.key.id, ip: null }, action: 'part.created', entity: 'part', entityId: null, at: ctx.clock.now() }));
    const res = await owner.get(`${base}/audit-events`).query({ actor: body.key.id }).expect(200);
    expect(res.body.events).toEqual([expect.objectContaining({ action: 'part.created', actor: expect.objectContaining({ apiKeyId: body.key.id, apiKeyLabel: 'Owner script' }) })]);
  });

  it('pages with a cap of 100', async () => {
    for (let i = 0; i < 3; i++) await owner.patch(base).set(csrf).send({ name: `Harbour Works ${i}` }).expect(200);
    const page1 = await owner.get(`${base}/audit-events`).query({ entity: 'shop', pageSize: 2 }).expect(200);
    const page2 = await owner.get(`${base}/audit-events`).query({ entity: 'shop', pageSize: 2, page: 2 }).expect(200);
    expect(page1.body.events).toHaveLength(2);
    expect(page1.body.total).toBe(4); // created + 3 renames
    expect(page2.body.events).toHaveLength(2);
    expect(new Set([...page1.body.events, ...page2.body.events].map((e: { id: string }) => e.id)).size).toBe(4);
    await owner.get(`${base}/audit-events`).query({ pageSize: 101 }).expect(400);
    await owner.get(`${base}/audit-events`).query({ from: 'yesterday' }).expect(400);
    await owner.get(`${base}/audit-events`).query({ unknown: 1 }).expect(400);
  });

  it('is for owners only; another shop is a 404', async () => {
    for (const role of ['mechanic', 'buyer', 'viewer'] as const) {
      const agent = await signedInAgent(ctx.app, seeded.byRole[role].email, seeded.password);
      await agent.get(`${base}/audit-events`).expect(403);
      await agent.get(`${base}/audit-events.csv`).expect(403);
    }
    const other = await seedShop(ctx, ['owner']);
    const otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    await otherOwner.get(`${base}/audit-events`).expect(404);
    // And their own log does not contain this shop's events.
    const theirs = await otherOwner.get(`/api/shops/${other.shop.id}/audit-events`).expect(200);
    expect(theirs.body.events.every((e: { entityId: string | null }) => e.entityId !== seeded.shop.id)).toBe(true);
  });

  it('exports CSV with formula-looking cells neutralised', async () => {
    ctx.clock.advance(1000); // so that the rename sorts after the creation
    await owner.patch(base).set(csrf).send({ name: '=HYPERLINK("http://evil.test","x")' }).expect(200);
    const res = await owner.get(`${base}/audit-events.csv`).query({ entity: 'shop' }).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="audit-log-.*\.csv"/);
    const rows = parseCsv(res.text);
    expect(rows[0]).toEqual(['created_at', 'action', 'entity', 'entity_id', 'actor_user_id', 'actor_name', 'actor_api_key_id', 'actor_api_key_label', 'ip', 'changes']);
    expect(rows.slice(1).map((r) => r[1])).toEqual(['shop.created', 'shop.updated']);
    const changes = JSON.parse(rows[2]![9]!) as Record<string, { after: string }>;
    expect(changes['name']!.after).toBe('=HYPERLINK("http://evil.test","x")');
    // The JSON cell starts with "{", so only a cell that itself starts with = + - @ is prefixed.
    expect(csvCell('=1+1')).toBe(`"'=1+1"`);
    expect(csvCell('+44 20')).toBe(`"'+44 20"`);
    expect(csvCell('-3')).toBe(`"'-3"`);
    expect(csvCell('@SUM(A1)')).toBe(`"'@SUM(A1)"`);
    expect(csvCell('say "hi"')).toBe(`"say ""hi"""`);
  });

  it('cannot be changed or deleted: the table is append-only', async () => {
    await expect(ctx.db.write((m) => m.query(`UPDATE audit_events SET action = 'x'`))).rejects.toThrow(/append-only/);
    await expect(ctx.db.write((m) => m.query(`DELETE FROM audit_events`))).rejects.toThrow(/append-only/);
  });
});
