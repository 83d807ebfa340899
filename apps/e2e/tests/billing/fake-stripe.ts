import { request } from '@playwright/test';
import { e2ePorts } from '../../playwright.config';

/** The fake Stripe API of the browser-test stack (tools/scripts/e2e-server.mjs puts it 9000 above the app). */
export const fakeStripeUrl = `http://127.0.0.1:${e2ePorts.app + 9000}`;

interface SentEvent {
  event: { type: string; data: { object: Record<string, unknown> } };
}

/** The customer and subscription Checkout created for a shop, read from the fake's sent events. */
export async function subscriptionOf(shopId: string): Promise<{ customer: string; subscription: string }> {
  const ctx = await request.newContext({ baseURL: fakeStripeUrl });
  try {
    const res = await ctx.get('/_test/events?type=checkout.session.completed');
    const { data } = (await res.json()) as { data: SentEvent[] };
    const session = data.map((e) => e.event.data.object).find((o) => o['client_reference_id'] === shopId);
    if (!session) throw new Error(`No completed checkout for shop ${shopId}`);
    return { customer: String(session['customer']), subscription: String(session['subscription']) };
  } finally {
    await ctx.dispose();
  }
}

/** Test controls: the next payment of `customer` fails, then the subscription renews (and so fails). */
export async function failNextRenewal(ids: { customer: string; subscription: string }): Promise<void> {
  const ctx = await request.newContext({ baseURL: fakeStripeUrl });
  try {
    const failed = await ctx.post('/_test/fail-next-payment', { data: { customer: ids.customer } });
    if (!failed.ok()) throw new Error(`fail-next-payment: ${failed.status()}`);
    const advanced = await ctx.post(`/_test/subscriptions/${ids.subscription}/advance`, { data: { to: 'renewal' } });
    if (!advanced.ok()) throw new Error(`advance: ${advanced.status()} ${await advanced.text()}`);
  } finally {
    await ctx.dispose();
  }
}
