// Shared pieces for the fake's tests: a webhook receiver, an SDK client pointed at the fake, and a
// stand-in for a browser submitting the hosted pages' forms.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';

export interface ReceivedWebhook {
  rawBody: string;
  signature: string;
}

export interface WebhookReceiver {
  url: string;
  received: ReceivedWebhook[];
  /** Status to answer with; change it to simulate an app that is down. */
  respondWith: number;
  /** Answer this many of the next requests with 503 first (a brief outage), whatever respondWith says. */
  failNext: number;
  close(): Promise<void>;
}

/** A tiny HTTP server that keeps every webhook it gets, raw body and signature header. */
export async function startReceiver(): Promise<WebhookReceiver> {
  const receiver: WebhookReceiver = { url: '', received: [], respondWith: 200, failNext: 0, close: async () => undefined };
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      receiver.received.push({ rawBody: Buffer.concat(chunks).toString('utf8'), signature: String(req.headers['stripe-signature'] ?? '') });
      const status = receiver.failNext > 0 ? 503 : receiver.respondWith;
      if (receiver.failNext > 0) receiver.failNext -= 1;
      res.writeHead(status, { 'Content-Type': 'application/json' }).end('{}');
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  receiver.url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/webhook`;
  receiver.close = () =>
    new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
  return receiver;
}

/** The official SDK, pointed at the fake by constructor options only. */
export function sdkFor(port: number, key = 'sk_test_local'): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
}

/** Polls until `check` returns a value (not a fixed sleep: it returns as soon as it can). */
export async function waitFor<T>(check: () => T | undefined | null | false, timeoutMs = 3000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = check();
    if (value) return value;
    if (Date.now() > until) throw new Error('waitFor: timed out');
    await new Promise((r) => setTimeout(r, 10));
  }
}

/** Reads one form of a hosted page: its action and hidden token. */
export function formOf(html: string, actionEndsWith: string): { action: string; token: string } {
  const forms = [...html.matchAll(/<form method="post" action="([^"]+)"[^>]*>([\s\S]*?)<\/form>/g)];
  const form = forms.find((f) => f[1]!.endsWith(actionEndsWith));
  if (!form) throw new Error(`no form ending in ${actionEndsWith}`);
  const token = /name="token" value="([^"]+)"/.exec(form[2]!)?.[1];
  if (!token) throw new Error('form has no token');
  return { action: form[1]!, token };
}

/** Posts a form like a browser would (urlencoded, no redirect following). */
export function postForm(base: string, action: string, fields: Record<string, string>): Promise<Response> {
  return fetch(new URL(action, base), {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(fields).toString(),
    redirect: 'manual',
  });
}

/** The card fields the checkout page comes filled with. */
export const TEST_CARD = { name: 'Test Cardholder', card_number: '4444 3333 2222 1111', expiry: '12/39', cvc: '123' };

/** Opens a checkout page and presses Pay with the prefilled card. */
export async function payCheckout(checkoutUrl: string, extra: Record<string, string> = {}): Promise<Response> {
  const html = await (await fetch(checkoutUrl)).text();
  const { action, token } = formOf(html, '/pay');
  return postForm(checkoutUrl, action, { token, ...TEST_CARD, ...extra });
}

/** Calls a test control with a JSON body. */
export async function control(base: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await fetch(`${base}/_test${path}`, {
    method,
    headers: body === undefined ? {} : { 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}
