// A local stand-in for the Stripe API that the official `stripe` SDK can be pointed at
// (`new Stripe(key, { host, port, protocol: 'http' })`), with its own checkout and billing-portal
// pages, signed webhooks and test controls. For the demo and the tests only; never for production.
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import express, { type NextFunction, type Request, type Response } from 'express';
import { z } from 'zod';
import { apiRouter } from './api-routes.ts';
import { type Emitted, FakeBilling } from './billing.ts';
import { FakeStripeError } from './errors.ts';
import { esc, pagesRouter } from './pages.ts';
import { FakeStripeStore } from './store.ts';
import { testRouter } from './test-routes.ts';
import { WebhookDispatcher } from './webhooks.ts';

/** Products and prices the fake starts with (and returns to on reset). */
export const catalogueSchema = z.array(
  z.strictObject({
    product: z.strictObject({ id: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/).optional(), name: z.string().min(1).max(250), description: z.string().max(2000).optional(), metadata: z.record(z.string(), z.string()).optional() }),
    prices: z.array(
      z.strictObject({
        lookup_key: z.string().min(1).max(200).optional(),
        currency: z.string().regex(/^[a-z]{3}$/),
        unit_amount: z.number().int().min(0),
        recurring: z.strictObject({ interval: z.enum(['day', 'week', 'month', 'year']), interval_count: z.number().int().min(1).max(12).optional() }).optional(),
        nickname: z.string().max(250).optional(),
        metadata: z.record(z.string(), z.string()).optional(),
      }),
    ),
  }),
);
export type Catalogue = z.infer<typeof catalogueSchema>;

export interface FakeStripeOptions {
  /** Port to listen on; 0 picks a free one. */
  port: number;
  /** Interface to bind; defaults to 127.0.0.1 so the fake is not reachable from elsewhere. */
  host?: string;
  /** Where webhooks go; null records events without sending them. */
  webhookUrl: string | null;
  /** The `whsec_…` secret the app verifies signatures with. */
  webhookSecret: string;
  /** Base URL browsers use for the hosted pages; defaults to the address the fake listens on. */
  publicUrl?: string;
  /** Waits between delivery retries; the default retries three times over about half a minute. */
  webhookRetryDelaysMs?: readonly number[];
  /** Time one delivery may take. */
  webhookTimeoutMs?: number;
  /** How long hosted pages and test controls wait for the first delivery of their events. */
  settleTimeoutMs?: number;
  /** Products and prices to create at start and again after each reset. */
  catalogue?: Catalogue;
}

export interface FakeStripe {
  /** Where the fake listens, e.g. http://127.0.0.1:12111. */
  url: string;
  port: number;
  store: FakeStripeStore;
  /** Forgets everything (and seeds the catalogue again), like `POST /_test/reset`. */
  reset(): void;
  close(): Promise<void>;
}

function seed(billing: FakeBilling, catalogue: Catalogue | undefined): void {
  for (const entry of catalogue ?? []) {
    const product = billing.createProduct(entry.product);
    for (const p of entry.prices) billing.createPrice({ ...p, product: product.id });
  }
}

function isJsonPath(req: Request): boolean {
  return req.path.startsWith('/v1/') || req.path.startsWith('/_test/');
}

/** Starts the fake. The SDK talks to `url`; browsers are sent to `publicUrl` (default `url`). */
export async function startFakeStripe(options: FakeStripeOptions): Promise<FakeStripe> {
  const host = options.host ?? '127.0.0.1';
  const store = new FakeStripeStore();
  const dispatcher = new WebhookDispatcher({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    retryDelaysMs: options.webhookRetryDelaysMs ?? [1_000, 5_000, 25_000],
    timeoutMs: options.webhookTimeoutMs ?? 10_000,
  });
  let publicUrl = options.publicUrl?.replace(/\/+$/, '') ?? '';
  const billing = new FakeBilling(store, dispatcher, () => publicUrl);
  const settleTimeout = options.settleTimeoutMs ?? 10_000;
  const settle = async (emitted: Emitted): Promise<void> => {
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([emitted.delivered, new Promise<void>((r) => (timer = setTimeout(r, settleTimeout)))]);
    clearTimeout(timer);
  };
  const reset = () => {
    dispatcher.cancelRetries();
    store.clear();
    seed(billing, options.catalogue);
  };
  seed(billing, options.catalogue);

  const app = express();
  app.disable('x-powered-by');
  // The SDK sends `lookup_keys[0]=…` and `line_items[0][price]=…`: qs-style nesting, in the query and in the body.
  app.set('query parser', 'extended');
  app.use(express.urlencoded({ extended: true, limit: '200kb' }));
  app.use('/_test', express.json({ limit: '100kb' }), testRouter({ store, billing, settle, reset }));
  app.use('/v1', apiRouter(store, billing, () => publicUrl));
  app.use(pagesRouter({ store, billing, settle }));
  app.get('/', (_req, res) => {
    res
      .type('html')
      .send(
        `<!doctype html><html lang="en-GB"><head><meta charset="utf-8"><title>Tappet test payments</title></head><body><main><h1>Tappet's local payment stand-in is running</h1><p>The app reaches it through the official SDK; people reach its checkout and billing pages through links the app gives them. Test controls live under <code>${esc('/_test/')}</code>.</p></main></body></html>`,
      );
  });
  app.use((req: Request, res: Response) => {
    if (isJsonPath(req)) res.status(404).json(new FakeStripeError(404, 'not_found', `Nothing at ${req.method} ${req.path}.`).toJSON());
    else res.status(404).type('text').send('Not found');
  });
  app.use((err: unknown, req: Request, res: Response, _next: NextFunction) => {
    const known =
      err instanceof FakeStripeError
        ? err
        : // body-parser errors carry a status (400 malformed, 413 too large).
          typeof err === 'object' && err !== null && 'status' in err && typeof err.status === 'number' && err.status < 500
          ? new FakeStripeError(err.status, 'invalid_body', err instanceof Error ? err.message : 'Invalid request body.')
          : null;
    if (!known) console.error('[fake-stripe]', err);
    const error = known ?? new FakeStripeError(500, 'internal_error', 'The local fake hit an unexpected error; see its console.', undefined, 'api_error');
    if (isJsonPath(req)) res.status(error.status).json(error.toJSON());
    else res.status(error.status).type('text').send(error.message);
  });

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port, host, (err?: Error) => (err ? reject(err) : resolve(s)));
  });
  const port = (server.address() as AddressInfo).port;
  const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
  if (!publicUrl) publicUrl = url;

  return {
    url,
    port,
    store,
    reset,
    close: () =>
      new Promise<void>((resolve, reject) => {
        dispatcher.close();
        server.close((err) => (err ? reject(err) : resolve()));
        server.closeAllConnections();
      }),
  };
}
