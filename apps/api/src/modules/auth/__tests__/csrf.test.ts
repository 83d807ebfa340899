import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
beforeAll(async () => {
  ctx = await createTestContext({ env: { TRUSTED_ORIGINS: 'http://localhost:5173' } });
  shop = await seedShop(ctx, ['owner']);
});
afterAll(() => ctx.close());

describe('CSRF protection', () => {
  it('refuses a change without the X-CSRF header', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const res = await agent.patch(`/api/shops/${shop.shop.id}`).send({ name: 'Renamed without header' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_rejected');
  });

  it('refuses sign-in without the header too (login CSRF)', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').send({ email: shop.byRole.owner.email, password: shop.password });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_rejected');
  });

  it('refuses a foreign Origin even with the header', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const res = await agent.patch(`/api/shops/${shop.shop.id}`).set(csrf).set('Origin', 'https://evil.test').send({ name: 'Renamed from elsewhere' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_rejected');
  });

  it('refuses a cross-site Sec-Fetch-Site even with the header', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    for (const site of ['cross-site', 'same-site']) {
      const res = await agent.post('/api/auth/sign-out').set(csrf).set('Sec-Fetch-Site', site);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf_rejected');
    }
    // Still signed in: nothing happened.
    expect((await agent.get('/api/me')).status).toBe(200);
  });

  it('refuses a form-encoded body with 415', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).type('form').send({ email: shop.byRole.owner.email, password: shop.password });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it('accepts same-origin requests, PUBLIC_URL and trusted origins', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const ok = [
      agent.patch(`/api/shops/${shop.shop.id}`).set(csrf).set('Sec-Fetch-Site', 'same-origin').set('Origin', 'http://tappet.test').send({ name: 'Harbour Test One' }),
      agent.patch(`/api/shops/${shop.shop.id}`).set(csrf).set('Origin', 'http://localhost:5173').send({ name: 'Harbour Test Two' }),
    ];
    for (const res of await Promise.all(ok)) expect(res.status).toBe(200);
  });

  it('does not ask for the header on reads', async () => {
    const agent = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    expect((await agent.get('/api/me').set('Sec-Fetch-Site', 'cross-site')).status).toBe(200);
  });
});
