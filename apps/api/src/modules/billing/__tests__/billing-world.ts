// A test world for billing: the app listening on a port, the fake Stripe API (tools/fake-stripe)
// sending its signed webhooks to it, and helpers to pay a checkout page like a browser would.
/* eslint-disable @nx/enforce-module-boundaries -- tests drive the repo's own fake Stripe API (tools/). */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import Stripe from 'stripe';
import { startFakeStripe, type FakeStripe } from '../../../../../../tools/fake-stripe/server.ts';
import { createTestContext, type TestContext } from '../../../test-support/test-app';
import { PlanEntity, ShopBillingEntity, type Plan } from '../billing.entity';
import { defaultBilling } from '../billing-state';

export const webhookSecret = 'whsec_api_tests_only';

export interface BillingWorld {
  ctx: TestContext;
  fake: FakeStripe;
  /** The SDK, pointed at the fake, for what a test does "as Stripe". */
  stripe: Stripe;
  close(): Promise<void>;
}

/** Starts the app on a free port and the fake Stripe API delivering webhooks to it. */
export async function startBillingWorld(): Promise<BillingWorld> {
  const server: Server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const appUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const fake = await startFakeStripe({ port: 0, webhookUrl: `${appUrl}/api/billing/webhook`, webhookSecret, webhookRetryDelaysMs: [], settleTimeoutMs: 5000 });
  const ctx = await createTestContext({ env: { STRIPE_API_URL: fake.url, STRIPE_SECRET_KEY: 'sk_test_api_tests', STRIPE_WEBHOOK_SECRET: webhookSecret } });
  server.on('request', ctx.app);
  const stripe = new Stripe('sk_test_api_tests', { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
  return {
    ctx,
    fake,
    stripe,
    async close() {
      await fake.close();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await ctx.close();
    },
  };
}

/** Adds a plan (the fake creates its Stripe price on first checkout, found by lookup key). */
export async function addPlan(ctx: Pick<TestContext, 'db' | 'clock'>, limits: Partial<Pick<Plan, 'seatLimit' | 'catalogueLimit' | 'vehicleLimit' | 'monthlyPriceMinor'>> = {}): Promise<Plan> {
  const suffix = randomUUID().slice(0, 8);
  const now = ctx.clock.now();
  const plan: Plan = {
    id: randomUUID(),
    name: `Bench ${suffix}`,
    monthlyPriceMinor: limits.monthlyPriceMinor ?? 2900,
    currency: 'gbp',
    stripeLookupKey: `tappet_bench_${suffix}`,
    seatLimit: limits.seatLimit ?? null,
    catalogueLimit: limits.catalogueLimit ?? null,
    vehicleLimit: limits.vehicleLimit ?? null,
    isActive: true,
    createdAt: now,
    updatedAt: now,
  };
  await ctx.db.write((m) => m.insert(PlanEntity, plan));
  return plan;
}

/** Puts a shop on a plan, in its trial (as onboarding does). */
export async function putOnPlan(ctx: Pick<TestContext, 'db' | 'clock'>, shopId: string, planId: string): Promise<void> {
  await ctx.db.write((m) => m.insert(ShopBillingEntity, { ...defaultBilling(shopId, ctx.clock.now()), planId }));
}

/** Submits a hosted checkout page's payment form with its prefilled test card. Returns the redirect. */
export async function payCheckout(checkoutUrl: string): Promise<Response> {
  const page = await fetch(checkoutUrl);
  const html = await page.text();
  const form = /<form method="post" action="([^"]+\/pay)"[^>]*>([\s\S]*?)<\/form>/.exec(html);
  if (!form) throw new Error(`no payment form on ${checkoutUrl}: ${html.slice(0, 300)}`);
  const fields: Record<string, string> = {};
  for (const input of form[2]!.matchAll(/<input\b[^>]*>/g)) {
    const name = /\bname="([^"]*)"/.exec(input[0])?.[1];
    const value = /\bvalue="([^"]*)"/.exec(input[0])?.[1] ?? '';
    if (name) fields[name] = value.replace(/&#x2F;|&#47;/g, '/').replace(/&amp;/g, '&');
  }
  return fetch(new URL(form[1]!, checkoutUrl), { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(fields).toString(), redirect: 'manual' });
}
