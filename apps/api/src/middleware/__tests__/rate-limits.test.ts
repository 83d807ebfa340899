// Routes that send e-mail share an hourly allowance per person and shop (issue 13): the request
// past it answers 429 with Retry-After, another person is unaffected, and the hour frees it again.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailSendingRoutes, mailSendingWhenAsked } from '../../app';
import { defaultPayLinkLimit } from '../../modules/sales/sales.router';
import { createShopWithUsers } from '../../modules/test-support/test-support.service';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../test-support/test-app';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;

beforeAll(async () => {
  ctx = await createTestContext({ deps: { mailRequestLimit: { limit: 2, windowMs: 60 * 60_000 } } });
  shop = await seedShop(ctx, ['owner', 'buyer']);
});
afterAll(() => ctx.close());

describe('the e-mail allowance', () => {
  it('refuses the third request in the hour for one person, not for another, and frees up after the hour', async () => {
    const buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const send = (agent: typeof buyer) => agent.post(`/api/shops/${shop.shop.id}/purchasing/orders/${randomUUID()}/send`).set(csrf);
    // Counted whether or not the order exists: the allowance is for attempts.
    expect((await send(buyer)).status).toBe(404);
    expect((await buyer.post(`/api/shops/${shop.shop.id}/purchasing/orders/${randomUUID()}/request-approval`).set(csrf)).status).toBe(404);
    const refused = await send(buyer);
    expect(refused.status).toBe(429);
    expect(refused.body.error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/Too many e-mails/) });
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    expect((await send(owner)).status).toBe(404);
    ctx.clock.advance(60 * 60_000 + 1000);
    expect((await send(buyer)).status).toBe(404);
  });

  it('does not count requests without a session', async () => {
    const anonymous = () => request(ctx.app).post(`/api/shops/${shop.shop.id}/purchasing/orders/${randomUUID()}/send`).set(csrf);
    for (let i = 0; i < 3; i++) expect((await anonymous()).status).toBe(401);
  });

  it('lists only routes that a router answers, so a renamed route cannot slip out of the allowance', async () => {
    const admin = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
    const agent = await signedInAgent(ctx.app, admin.users[0]!.email, admin.password);
    for (const route of [...mailSendingRoutes, ...Object.keys(mailSendingWhenAsked)]) {
      const path = `/api${route.replace(':shopId', randomUUID()).replace(':orderId', randomUUID())}`;
      const res = await agent.post(path).set(csrf).send({});
      // A route nobody serves falls through to "No such API route."; a served one answers itself.
      expect(res.body.error?.message, path).not.toBe('No such API route.');
    }
  });

  it('counts an invoice issue or a counter sale only when it asks for an e-mail, and a credit note always', async () => {
    const fresh = await seedShop(ctx, ['owner']);
    const owner = await signedInAgent(ctx.app, fresh.byRole.owner.email, fresh.password);
    const sales = `/api/shops/${fresh.shop.id}/sales`;
    const line = { partId: randomUUID(), binId: randomUUID(), condition: 'new', quantity: 1 };
    // No e-mail asked for: never counted, however many (404s here: the ids do not exist).
    for (let i = 0; i < 3; i++) {
      expect((await owner.post(`${sales}/invoices/${randomUUID()}/issue`).set(csrf).send({ sendEmail: false })).status).toBe(404);
      expect((await owner.post(`${sales}/counter-sales`).set(csrf).send({ lines: [line] })).status).toBe(404);
      expect((await owner.post(`${sales}/counter-sales`).set(csrf).send({ lines: [line], customerEmail: 'till@counter.test', issue: false })).status).toBe(404);
    }
    // Asked for (an issue e-mails by default; a counter sale to an address does): two allowed, the third refused.
    expect((await owner.post(`${sales}/invoices/${randomUUID()}/issue`).set(csrf).send({})).status).toBe(404);
    expect((await owner.post(`${sales}/counter-sales`).set(csrf).send({ lines: [line], customerEmail: 'till@counter.test' })).status).toBe(404);
    const refused = await owner.post(`${sales}/invoices/${randomUUID()}/credit-notes`).set(csrf).send({ reason: 'Wrong part' });
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
  });

  it('limits visits to customers\' pay links per address, whatever the token', async () => {
    const visit = () => request(ctx.app).get(`/api/pay/${randomUUID().replace(/-/g, '')}`);
    for (let i = 0; i < defaultPayLinkLimit.limit; i++) expect((await visit()).status).not.toBe(429);
    const refused = await visit();
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
  });
});
