import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestContext, csrf, type TestContext } from '../../../test-support/test-app';

// The public approval routes have their own per-address limit (60 requests in 15 minutes), so
// nobody can try tokens at speed; the limit lifts when the window has passed.

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

it('refuses the 61st request from one address within 15 minutes with 429 and Retry-After, then lets it through again', async () => {
  const agent = request(ctx.app);
  const attempt = (i: number) => agent.post('/api/estimate-approval/view').set(csrf).send({ token: String(i % 10).repeat(43) });
  for (let i = 0; i < 60; i++) expect((await attempt(i)).status).toBe(404);
  const limited = await agent.post('/api/estimate-approval/approve').set(csrf).send({ token: 'a'.repeat(43), version: 1, grossMinor: 1, name: 'Spray' });
  expect(limited.status).toBe(429);
  expect(limited.body.error.code).toBe('rate_limited');
  expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
  ctx.clock.advance(15 * 60_000 + 1000);
  expect((await attempt(1)).status).toBe(404);
});
