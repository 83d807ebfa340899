// Support access: without the owner's grant a platform admin gets 404 on shop routes like anyone
// else; with it they see the shop (never staff, keys, billing or grants), and every look and every
// change is audited and shown to the owner; revoking or expiry ends it at once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { createShopWithUsers } from '../../test-support/test-support.service';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
let adminLogin: { email: string; password: string };
const signIn = (who: { email: string; password: string }) => signedInAgent(ctx.app, who.email, who.password);
const ownerLogin = () => ({ email: shop.byRole.owner.email, password: shop.password });

beforeAll(async () => {
  ctx = await createTestContext();
  shop = await seedShop(ctx, ['owner', 'buyer']);
  const created = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
  adminLogin = { email: created.users[0]!.email, password: created.password };
});
afterAll(() => ctx.close());

describe('support access', () => {
  it('without a grant, shop routes answer 404 to a platform admin', async () => {
    const admin = await signIn(adminLogin);
    for (const path of ['', '/parts', '/staff', '/billing/status', '/support-access']) {
      expect((await admin.get(`/api/shops/${shop.shop.id}${path}`)).status).toBe(404);
    }
    expect((await admin.post(`/api/shops/${shop.shop.id}/parts`).set(csrf).send({ number: 'SA-0', description: 'x' })).status).toBe(404);
  });

  it('with a grant, the admin sees and helps, every action audited and shown to the owner; revoking ends it', async () => {
    const owner = await signIn(ownerLogin());
    const granted = await owner.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 2, note: 'Import looks wrong' });
    expect(granted.status).toBe(201);
    expect(granted.body).toMatchObject({ active: true, note: 'Import looks wrong', expiresAt: new Date(ctx.clock.now().getTime() + 2 * 3600_000).toISOString() });

    const admin = await signIn(adminLogin);
    // /api/me lists the granted shop for the console to open, marked with the grant's end.
    const me = await admin.get('/api/me');
    expect(me.body.memberships).toContainEqual(
      expect.objectContaining({ shopId: shop.shop.id, role: 'owner', supportUntil: granted.body.expiresAt, readOnly: false }),
    );
    expect(me.body.activeShopId).toBeNull();
    expect((await admin.get(`/api/shops/${shop.shop.id}/parts`)).status).toBe(200);
    const made = await admin.post(`/api/shops/${shop.shop.id}/parts`).set(csrf).send({ number: 'SA-1', description: 'Added by support' });
    expect(made.status).toBe(201);
    // Support does not manage people, keys, billing or its own access.
    expect((await admin.get(`/api/shops/${shop.shop.id}/staff`)).status).toBe(403);
    expect((await admin.get(`/api/shops/${shop.shop.id}/billing`)).status).toBe(403);
    expect((await admin.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 100 })).status).toBe(403);
    // The shop's other members cannot see or grant support access.
    const buyer = await signIn({ email: shop.byRole.buyer.email, password: shop.password });
    expect((await buyer.get(`/api/shops/${shop.shop.id}/support-access`)).status).toBe(403);

    const view = await owner.get(`/api/shops/${shop.shop.id}/support-access`);
    expect(view.body.current).toMatchObject({ id: granted.body.id, active: true });
    const activity = view.body.activity as Array<{ action: string; detail: string; actorName: string }>;
    expect(activity.map((a) => a.detail)).toEqual(expect.arrayContaining([`GET /api/shops/${shop.shop.id}/parts`, `POST /api/shops/${shop.shop.id}/parts`]));
    expect(activity.map((a) => a.action)).toContain('part.created');
    expect(activity.every((a) => a.actorName?.startsWith('Platform admin'))).toBe(true);

    expect((await owner.delete(`/api/shops/${shop.shop.id}/support-access`).set(csrf)).status).toBe(200);
    expect((await admin.get(`/api/shops/${shop.shop.id}/parts`)).status).toBe(404);
    expect((await admin.get('/api/me')).body.memberships.some((m: { shopId: string }) => m.shopId === shop.shop.id)).toBe(false);
    expect((await owner.delete(`/api/shops/${shop.shop.id}/support-access`).set(csrf)).status).toBe(404);
    const after = await owner.get(`/api/shops/${shop.shop.id}/support-access`);
    expect(after.body.current).toBeNull();
    expect(after.body.grants[0]).toMatchObject({ active: false });
  });

  it('ends by itself when the time is up', async () => {
    const owner = await signIn(ownerLogin());
    await owner.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 1 }).expect(201);
    ctx.clock.advance(59 * 60_000);
    expect((await (await signIn(adminLogin)).get(`/api/shops/${shop.shop.id}/parts`)).status).toBe(200);
    ctx.clock.advance(2 * 60_000);
    expect((await (await signIn(adminLogin)).get(`/api/shops/${shop.shop.id}/parts`)).status).toBe(404);
  });

  it('validates the length of a grant', async () => {
    const owner = await signIn(ownerLogin());
    expect((await owner.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 0 })).status).toBe(400);
    expect((await owner.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 169 })).status).toBe(400);
    expect((await owner.post(`/api/shops/${shop.shop.id}/support-access`).set(csrf).send({ hours: 2, shopId: shop.shop.id })).status).toBe(400);
  });
});
