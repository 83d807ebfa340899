import Stripe from 'stripe';
import type { Env } from '../../config/env';

/** Local defaults for the fake Stripe API (tools/fake-stripe); never used in production. */
export const localStripe = { secretKey: 'sk_test_local', webhookSecret: 'whsec_local_demo_only', apiUrl: 'http://127.0.0.1:12111' } as const;

/** The Stripe keys the app runs with: the configured ones, or the local fake's outside production. */
export function stripeSettings(env: Env): { secretKey: string; webhookSecret: string; apiUrl: string | null } {
  const local = env.mode !== 'production';
  return {
    secretKey: env.stripe.secretKey ?? (local ? localStripe.secretKey : ''),
    webhookSecret: env.stripe.webhookSecret ?? (local ? localStripe.webhookSecret : ''),
    apiUrl: env.stripe.apiUrl ?? (local ? localStripe.apiUrl : null),
  };
}

/**
 * The official SDK with the platform's key. With an API URL (the local fake) it is pointed there
 * by constructor options only: host, port and protocol.
 */
export function createStripeClient(env: Env): Stripe {
  const settings = stripeSettings(env);
  const base = { maxNetworkRetries: env.mode === 'production' ? 2 : 0, telemetry: false, timeout: 20_000 };
  if (!settings.apiUrl) return new Stripe(settings.secretKey, base);
  const url = new URL(settings.apiUrl);
  const protocol = url.protocol === 'https:' ? 'https' : 'http';
  return new Stripe(settings.secretKey, { ...base, host: url.hostname, port: url.port ? Number(url.port) : protocol === 'https' ? 443 : 80, protocol });
}
