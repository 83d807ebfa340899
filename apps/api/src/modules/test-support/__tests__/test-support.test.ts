import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('POST /api/test-support/shops (test mode)', () => {
  it('creates a uniquely named shop with a user per role, who can sign in', async () => {
    const res = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ roles: ['owner', 'buyer'], namePrefix: 'Parallel' });
    expect(res.status).toBe(201);
    expect(res.body.shop.name).toMatch(/^Parallel [0-9a-f]{8}$/);
    expect(res.body.users.map((u: { role: string }) => u.role)).toEqual(['owner', 'buyer']);
    const second = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ roles: ['owner'], namePrefix: 'Parallel' });
    expect(second.body.shop.name).not.toBe(res.body.shop.name);

    const buyer = res.body.users[1];
    const agent = await signedInAgent(ctx.app, buyer.email, res.body.password);
    const me = await agent.get('/api/me');
    expect(me.body.memberships).toEqual([{ shopId: res.body.shop.id, shopName: res.body.shop.name, role: 'buyer', spendingLimitMinor: 50_000, readOnly: false }]);
  });

  it('can make the new users members of an existing shop too (shop switching)', async () => {
    const first = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ roles: ['owner'] });
    const second = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ roles: ['owner'], alsoMemberOf: [{ shopId: first.body.shop.id, role: 'viewer' }] });
    expect(second.status).toBe(201);
    const agent = await signedInAgent(ctx.app, second.body.users[0].email, second.body.password);
    const me = await agent.get('/api/me');
    expect(me.body.memberships.map((m: { shopId: string; role: string }) => [m.shopId, m.role]).sort()).toEqual(
      [[first.body.shop.id, 'viewer'], [second.body.shop.id, 'owner']].sort(),
    );
    const unknown = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ alsoMemberOf: [{ shopId: '00000000-0000-4000-8000-000000000000', role: 'viewer' }] });
    expect(unknown.status).toBe(404);
  });

  it('validates its input strictly', async () => {
    const res = await request(ctx.app).post('/api/test-support/shops').set(csrf).send({ roles: ['janitor'] });
    expect(res.status).toBe(400);
  });
});

describe.each(['demo', 'production'] as const)('test-support routes in %s mode', (mode) => {
  it('are not mounted and not documented', async () => {
    const env: Record<string, string> =
      mode === 'production'
        ? { NODE_ENV: 'production', SMTP_HOST: 'smtp.example.test', SMTP_PORT: '587', SMTP_FROM: 'x@example.test', STRIPE_SECRET_KEY: 'sk_test_x', STRIPE_WEBHOOK_SECRET: 'whsec_x' }
        : { TAPPET_MODE: 'demo' };
    const other = await createTestContext({ env });
    try {
      expect(other.env.mode).toBe(mode);
      const res = await request(other.app).post('/api/test-support/shops').set(csrf).send({});
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      const doc = await request(other.app).get('/api/openapi.json');
      expect(Object.keys(doc.body.paths).some((p) => p.includes('test-support'))).toBe(false);
    } finally {
      await other.close();
    }
  });
});
