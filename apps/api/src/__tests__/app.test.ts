import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, type TestContext } from '../test-support/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('HTTP basics', () => {
  it('answers the health check', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
  });

  it('sends security headers with a same-origin CSP', async () => {
    const res = await request(ctx.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("font-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('answers unknown API routes with a JSON 404', async () => {
    const res = await request(ctx.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
  });

  it('answers malformed JSON with 400 and no stack trace', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).set('Content-Type', 'application/json').send('{"email": "a@b.test",');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/);
  });

  it('answers a body over 100 kb with 413', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/sign-in')
      .set(csrf)
      .send({ email: 'someone@example.test', password: 'x'.repeat(101 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('refuses unknown fields (strict schemas) with the offending path', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email: 'someone@example.test', password: 'secret-words', isPlatformAdmin: true });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details).toEqual([{ path: [], message: expect.stringContaining('isPlatformAdmin') }]);
  });

  it('reports each invalid field with its path', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email: 'not-an-address', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string[] }) => d.path.join('.'))).toEqual(['email', 'password']);
  });
});
