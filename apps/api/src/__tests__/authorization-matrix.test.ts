// The authorisation matrix: every API route, as data, with who may call it. Shop routes take
// their expectation from libs/permissions (the one definition of roles), so this checks the API
// against it; a route mounted without an entry here fails the last test.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defineAbilityFor, subjectOf, type Action, type AppAbility, type SubjectName } from '@tappet/permissions';
import type { ShopRole } from '@tappet/contracts';
import { mountedApiRoutes } from '../test-support/mounted-routes';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../test-support/test-app';
import { createShopWithUsers } from '../modules/test-support/test-support.service';

type Persona = 'anonymous' | ShopRole | 'outsider' | 'platformAdmin';
const personas: Persona[] = ['anonymous', 'owner', 'mechanic', 'buyer', 'viewer', 'outsider', 'platformAdmin'];

interface World {
  shopId: string;
  /** Sign-in of each persona. */
  people: Record<Exclude<Persona, 'anonymous'>, { email: string; password: string }>;
}

type Access =
  /** Anyone, signed in or not; `status` is the answer to the sample request. */
  | { kind: 'public'; status: number }
  /** Any signed-in person. */
  | { kind: 'signed-in'; status: number }
  /** Members of the shop in the request; others get 404. */
  | { kind: 'member'; status: number }
  /** Members whose ability allows `action` on `subject`; other members 403, non-members 404. */
  | { kind: 'ability'; action: Action; subject: SubjectName; status: number };

interface Entry {
  access: Access;
  call(agent: TestAgent<Test> | ReturnType<typeof request>, world: World): Test;
}

const matrix: Record<string, Entry> = {
  'GET /api/health': { access: { kind: 'public', status: 200 }, call: (a) => a.get('/api/health') },
  'GET /api/openapi.json': { access: { kind: 'public', status: 200 }, call: (a) => a.get('/api/openapi.json') },
  'POST /api/auth/sign-in': { access: { kind: 'public', status: 200 }, call: (a, w) => a.post('/api/auth/sign-in').set(csrf).send(w.people.viewer) },
  'POST /api/auth/password-reset/request': { access: { kind: 'public', status: 200 }, call: (a) => a.post('/api/auth/password-reset/request').set(csrf).send({ email: `nobody-${randomUUID()}@nowhere.test` }) },
  'POST /api/auth/password-reset/confirm': {
    // A made-up token: reachable by anyone, refused as invalid.
    access: { kind: 'public', status: 400 },
    call: (a) => a.post('/api/auth/password-reset/confirm').set(csrf).send({ token: 'x'.repeat(43), password: 'harbour lantern gearbox' }),
  },
  'POST /api/test-support/shops': { access: { kind: 'public', status: 201 }, call: (a) => a.post('/api/test-support/shops').set(csrf).send({ roles: [] }) },
  'POST /api/auth/sign-out': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.post('/api/auth/sign-out').set(csrf) },
  'GET /api/me': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.get('/api/me') },
  'GET /api/shops': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.get('/api/shops') },
  'POST /api/me/active-shop': { access: { kind: 'member', status: 200 }, call: (a, w) => a.post('/api/me/active-shop').set(csrf).send({ shopId: w.shopId }) },
  'GET /api/shops/:shopId': { access: { kind: 'ability', action: 'read', subject: 'Shop', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}`) },
  'PATCH /api/shops/:shopId': {
    access: { kind: 'ability', action: 'update', subject: 'Shop', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}`).set(csrf).send({ name: 'Matrix Renamed Shop' }),
  },
};

function expectedStatus(access: Access, persona: Persona, world: World): number {
  if (access.kind === 'public') return access.status;
  if (persona === 'anonymous') return 401;
  if (access.kind === 'signed-in') return access.status;
  const role = persona === 'outsider' || persona === 'platformAdmin' ? null : persona;
  if (role === null) return 404;
  if (access.kind === 'member') return access.status;
  const ability: AppAbility = defineAbilityFor({ userId: 'u', isPlatformAdmin: false }, { shopId: world.shopId, role, spendingLimitMinor: null });
  return ability.can(access.action, subjectOf(access.subject, { shopId: world.shopId })) ? access.status : 403;
}

let ctx: TestContext;
let world: World;
beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  const admin = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
  const member = (role: ShopRole) => ({ email: shop.byRole[role].email, password: shop.password });
  world = {
    shopId: shop.shop.id,
    people: {
      owner: member('owner'),
      mechanic: member('mechanic'),
      buyer: member('buyer'),
      viewer: member('viewer'),
      outsider: { email: other.byRole.owner.email, password: other.password },
      platformAdmin: { email: admin.users[0]!.email, password: admin.password },
    },
  };
});
afterAll(() => ctx.close());

describe('authorisation matrix', () => {
  for (const [route, entry] of Object.entries(matrix)) {
    for (const persona of personas) {
      it(`${route} as ${persona}`, async () => {
        const agent = persona === 'anonymous' ? request(ctx.app) : await signedInAgent(ctx.app, world.people[persona].email, world.people[persona].password);
        const res = await entry.call(agent, world);
        expect(res.status, JSON.stringify(res.body)).toBe(expectedStatus(entry.access, persona, world));
      });
    }
  }

  it('has an entry for every mounted API route', () => {
    expect(Object.keys(matrix).sort()).toEqual(mountedApiRoutes(ctx.app));
  });
});
