import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf, seedShop, signedInAgent } from '../../../test-support/test-app';
import { payCheckout, startBillingWorld, webhookSecret, type BillingWorld } from '../../billing/__tests__/billing-world';

// Card payments of invoices: a one-off Checkout session (mode 'payment') made with the stripe SDK
// against the local fake (tools/fake-stripe), paid on the fake's own checkout page, and recorded
// only when the signed `checkout.session.completed` webhook arrives. A forged webhook changes
// nothing; a replayed one is recorded once.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let world: BillingWorld;
let shopId: string;
let owner: Agent;
let buyer: Agent;

const url = (path: string) => `/api/shops/${shopId}/sales${path}`;

beforeAll(async () => {
  world = await startBillingWorld();
  const shop = await seedShop(world.ctx);
  shopId = shop.shop.id;
  owner = await signedInAgent(world.ctx.app, shop.byRole.owner.email, shop.password);
  buyer = await signedInAgent(world.ctx.app, shop.byRole.buyer.email, shop.password);
}, 60_000);
afterAll(() => world.close());

async function issued(unitPriceMinor: number, customerEmail: string | null = null): Promise<{ id: string; number: string; grossMinor: number }> {
  const draft = await owner.post(url('/invoices')).set(csrf).send({ customerName: 'Fen Aldridge', customerEmail, lines: [{ kind: 'other', description: 'Magneto rebuild', quantity: 1, unitPriceMinor }] });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const res = await owner.post(url(`/invoices/${draft.body.id}/issue`)).set(csrf).send({});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

describe('card payments', () => {
  it('records a card payment only from the signed webhook after the fake checkout page is paid', async () => {
    // 120.00 + 20 % = 144.00; pay 44.00 by card, part of it.
    const inv = await issued(12000, 'hal@brennock.test');
    const start = await owner.post(url(`/invoices/${inv.id}/card-checkout`)).set(csrf).send({ amountMinor: 4400 });
    expect(start.status, JSON.stringify(start.body)).toBe(200);
    expect(start.body.amountMinor).toBe(4400);
    const session = await world.stripe.checkout.sessions.retrieve(start.body.sessionId);
    expect(session).toMatchObject({ mode: 'payment', amount_total: 4400, currency: 'gbp', payment_status: 'unpaid' });
    // Nothing is paid until the webhook says so.
    expect((await owner.get(url(`/invoices/${inv.id}`))).body.paidMinor).toBe(0);
    const paid = await payCheckout(start.body.url);
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toContain(`/shops/${shopId}/sales/invoices/${inv.id}`);
    const after = await owner.get(url(`/invoices/${inv.id}`));
    expect(after.body).toMatchObject({ paidMinor: 4400, dueMinor: 10000, paymentStatus: 'part_paid' });
    expect(after.body.payments).toEqual([expect.objectContaining({ method: 'card', amountMinor: 4400 })]);

    // Stripe sends the event again: still one payment.
    const events = (await (await fetch(`${world.fake.url}/_test/events?type=checkout.session.completed`)).json()) as { data: Array<{ id: string; delivery: { status: string }; event: { data: { object: { id: string } } } }> };
    const ours = events.data.find((e) => e.event.data.object.id === start.body.sessionId)!;
    expect(ours).toBeDefined();
    expect((await fetch(`${world.fake.url}/_test/resend/${ours.id}`, { method: 'POST' })).status).toBe(200);
    expect((await owner.get(url(`/invoices/${inv.id}`))).body.payments).toHaveLength(1);
  });

  it('refuses a forged webhook and records nothing', async () => {
    const inv = await issued(5000);
    const forgedSession = {
      id: 'cs_test_forged_0001',
      object: 'checkout.session',
      mode: 'payment',
      payment_status: 'paid',
      amount_total: 6000,
      metadata: { purpose: 'tappet_invoice_payment', shopId, invoiceId: inv.id },
    };
    const payload = JSON.stringify({ id: 'evt_forged_0001', object: 'event', type: 'checkout.session.completed', data: { object: forgedSession } });
    const header = Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_real_secret' });
    const hook = (signature: string) => request(world.ctx.app).post('/api/billing/webhook').set('Content-Type', 'application/json').set('Stripe-Signature', signature).send(payload);
    expect((await hook(header)).status).toBe(400);
    expect((await owner.get(url(`/invoices/${inv.id}`))).body).toMatchObject({ paidMinor: 0, paymentStatus: 'unpaid' });
    // The same body signed with the right secret is accepted: the signature is what decided.
    const good = Stripe.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
    expect((await hook(good)).status).toBe(200);
    expect((await owner.get(url(`/invoices/${inv.id}`))).body.paidMinor).toBe(6000);
  });

  it('lets the customer pay what is due from the e-mailed link, without an account', async () => {
    world.ctx.mailer.outbox.length = 0;
    const inv = await issued(2500, 'gwen@tolley.test');
    const mail = world.ctx.mailer.outbox.find((m) => m.to === 'gwen@tolley.test')!;
    const link = /http:\/\/tappet\.test(\/api\/pay\/[A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
    const res = await request(world.ctx.app).get(link);
    expect(res.status).toBe(303);
    const checkout = res.headers['location'] as string;
    expect(checkout.startsWith(world.fake.url)).toBe(true);
    expect((await payCheckout(checkout)).status).toBe(303);
    // 25.00 + 20 % = 30.00, all paid.
    expect((await owner.get(url(`/invoices/${inv.id}`))).body).toMatchObject({ paidMinor: 3000, dueMinor: 0, paymentStatus: 'paid' });
    const done = await request(world.ctx.app).get(`${link}/done`);
    expect(done.text).toContain('is paid');
    // Nothing more to pay: the link says so instead of opening a checkout.
    expect((await request(world.ctx.app).get(link)).status).toBe(200);
    expect((await request(world.ctx.app).get('/api/pay/not-a-real-token-at-all-xyz')).status).toBe(404);
  });

  it('shows the surplus when two checkouts for the whole amount both complete', async () => {
    // 50.00 + 20 % = 60.00. Two checkouts are opened before either is paid (two tabs, or the
    // customer's link and the counter): each is for what was due then, and Stripe takes both.
    const inv = await issued(5000, 'ria@penhallow.test');
    const first = await owner.post(url(`/invoices/${inv.id}/card-checkout`)).set(csrf).send({});
    const second = await owner.post(url(`/invoices/${inv.id}/card-checkout`)).set(csrf).send({});
    expect([first.status, second.status]).toEqual([200, 200]);
    expect((await payCheckout(first.body.url)).status).toBe(303);
    expect((await owner.get(url(`/invoices/${inv.id}`))).body).toMatchObject({ paidMinor: 6000, dueMinor: 0, overpaidMinor: 0, paymentStatus: 'paid' });
    expect((await payCheckout(second.body.url)).status).toBe(303);
    const after = await owner.get(url(`/invoices/${inv.id}`));
    expect(after.body).toMatchObject({ paidMinor: 12000, dueMinor: 0, overpaidMinor: 6000, paymentStatus: 'paid' });
    expect(after.body.payments).toHaveLength(2);
    // The list carries it too.
    const listed = (await owner.get(url('/invoices?pageSize=100'))).body.invoices.find((i: { id: string }) => i.id === inv.id);
    expect(listed).toMatchObject({ overpaidMinor: 6000 });
  });

  it('lets only the owner start a card payment, and never for more than is due', async () => {
    const inv = await issued(1000);
    expect((await buyer.post(url(`/invoices/${inv.id}/card-checkout`)).set(csrf).send({})).status).toBe(403);
    const over = await owner.post(url(`/invoices/${inv.id}/card-checkout`)).set(csrf).send({ amountMinor: 1201 });
    expect(over.status).toBe(409);
    const draft = await owner.post(url('/invoices')).set(csrf).send({ customerName: 'Draft', lines: [{ kind: 'other', description: 'x', quantity: 1, unitPriceMinor: 100 }] });
    expect((await owner.post(url(`/invoices/${draft.body.id}/card-checkout`)).set(csrf).send({})).status).toBe(409);
  });
});
