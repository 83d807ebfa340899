import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mountedApiRoutes } from '../test-support/mounted-routes';
import { createTestContext, type TestContext } from '../test-support/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('GET /api/openapi.json', () => {
  it('is an OpenAPI 3.1 document', async () => {
    const res = await request(ctx.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.paths['/api/auth/sign-in'].post.requestBody.content['application/json'].schema.properties).toHaveProperty('email');
  });

  it('lists every mounted API route, and nothing else', async () => {
    const res = await request(ctx.app).get('/api/openapi.json');
    const documented = Object.entries(res.body.paths as Record<string, Record<string, unknown>>)
      .flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p.replace(/\{(\w+)\}/g, ':$1')}`))
      .sort();
    const mounted = mountedApiRoutes(ctx.app);
    expect(mounted.length).toBeGreaterThan(8);
    expect(documented).toEqual(mounted);
  });

  it('describes the error shape and the CSRF header on writes', async () => {
    const res = await request(ctx.app).get('/api/openapi.json');
    const patch = res.body.paths['/api/shops/{shopId}'].patch;
    expect(patch.parameters.map((p: { name: string; in: string }) => `${p.in}:${p.name}`)).toEqual(expect.arrayContaining(['path:shopId', 'header:x-csrf']));
    expect(patch.responses['403'].content['application/json'].schema).toBeDefined();
  });
});
