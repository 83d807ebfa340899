// The pages a customer's browser visits: the checkout page at a session's `url`, the billing
// portal at a portal session's `url`, and a read-only invoice page. Plain HTML forms, no script.
// Every page says plainly that it is Tappet's local test stand-in for the payment provider.
import { timingSafeEqual } from 'node:crypto';
import express, { type Request, type Response, type Router } from 'express';
import { z } from 'zod';
import type { CardInput, Emitted, FakeBilling } from './billing.ts';
import type { CheckoutSessionRecord, FakeStripeStore, InvoiceObject, PortalSessionRecord, PriceObject, SubscriptionRecord } from './store.ts';

const ZERO_DECIMAL = new Set(['bif', 'clp', 'djf', 'gnf', 'jpy', 'kmf', 'krw', 'mga', 'pyg', 'rwf', 'ugx', 'vnd', 'vuv', 'xaf', 'xof', 'xpf']);
const PREFILLED_CARD = { name: 'Test Cardholder', number: '4444 3333 2222 1111', cvc: '123' };

/** Escapes text for HTML element content and attribute values. */
export function esc(value: unknown): string {
  return String(value ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Formats an amount in the currency's smallest unit. */
export function money(amount: number, currency: string): string {
  const major = ZERO_DECIMAL.has(currency) ? amount : amount / 100;
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(major);
  } catch {
    return `${major.toFixed(ZERO_DECIMAL.has(currency) ? 0 : 2)} ${currency.toUpperCase()}`;
  }
}

function date(ts: number | null | undefined): string {
  if (!ts) return '—';
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(ts * 1000));
}

function every(price: PriceObject): string {
  const r = price.recurring;
  if (!r) return 'once';
  return r.interval_count === 1 ? `every ${r.interval}` : `every ${r.interval_count} ${r.interval}s`;
}

const STATUS_WORDS: Record<string, string> = {
  active: 'Active',
  trialing: 'On trial',
  past_due: 'Payment overdue',
  unpaid: 'Unpaid — payments stopped',
  canceled: 'Ended',
  incomplete: 'Waiting for first payment',
  incomplete_expired: 'Expired before first payment',
  paused: 'Paused',
  paid: 'Paid',
  open: 'Awaiting payment',
  draft: 'Draft',
  void: 'Void',
  uncollectible: 'Uncollectible',
};

const STYLE = `
:root { --ground:#F7F4EC; --surface:#FFFDF8; --ink:#1F1D1A; --ink2:#57524A; --accent:#0F5C5C; --fail:#9E2B1E; --ok:#2E6B34; --line:#D9D2C3; }
* { box-sizing:border-box; }
body { margin:0; background:var(--ground); color:var(--ink); font:16px/1.5 "Atkinson Hyperlegible", system-ui, sans-serif; }
.standin { background:repeating-linear-gradient(135deg,#FFF3D6 0 12px,#FBE9BF 12px 24px); border-bottom:2px dashed var(--ink); padding:.75rem 1rem; }
.standin p { margin:0 auto; max-width:44rem; } .standin strong { letter-spacing:.04em; }
main { max-width:44rem; margin:0 auto; padding:1.5rem 1rem 3rem; }
h1 { font-size:1.75rem; margin:.5rem 0 1rem; } h2 { font-size:1.25rem; margin:0 0 .75rem; }
section, .card { background:var(--surface); border:1px solid var(--line); border-radius:6px; padding:1rem 1.25rem; margin:0 0 1.25rem; }
table { width:100%; border-collapse:collapse; } caption { text-align:left; font-weight:700; padding-bottom:.5rem; }
th, td { text-align:left; padding:.5rem .25rem; border-bottom:1px solid var(--line); vertical-align:top; }
th.num { text-align:right; } td.num { text-align:right; font-family:"IBM Plex Mono", ui-monospace, monospace; font-variant-numeric:tabular-nums; }
tfoot th, tfoot td { border-bottom:0; font-weight:700; }
label { display:block; font-weight:700; margin:.75rem 0 .25rem; }
input[type=text], input[type=email] { width:100%; min-height:44px; padding:.5rem .75rem; border:1px solid var(--ink2); border-radius:4px; font:inherit; background:#fff; }
.mono { font-family:"IBM Plex Mono", ui-monospace, monospace; }
.row { display:flex; gap:1rem; } .row > div { flex:1; }
button { min-height:44px; padding:.5rem 1.25rem; font:inherit; font-weight:700; border-radius:4px; cursor:pointer; border:2px solid var(--accent); }
button.primary { background:var(--accent); color:#fff; } button.secondary { background:transparent; color:var(--accent); }
button.danger { background:transparent; color:var(--fail); border-color:var(--fail); }
:focus-visible { outline:3px solid var(--accent); outline-offset:2px; }
.actions { display:flex; gap:.75rem; flex-wrap:wrap; align-items:center; margin-top:1rem; }
.hint { color:var(--ink2); font-size:.9rem; margin:.25rem 0 0; }
.alert { border:2px solid var(--fail); background:#FBEDEA; padding:.75rem 1rem; border-radius:4px; margin:0 0 1rem; }
.notice { border:2px solid var(--ok); background:#EDF5EC; padding:.75rem 1rem; border-radius:4px; margin:0 0 1rem; }
.field-error { color:var(--fail); font-weight:700; margin:.25rem 0 0; }
dl { display:grid; grid-template-columns:max-content 1fr; gap:.25rem 1rem; margin:0; } dt { font-weight:700; } dd { margin:0; }
fieldset { border:1px solid var(--line); border-radius:4px; margin:1rem 0 0; padding:.5rem 1rem 1rem; }
fieldset label { font-weight:400; display:flex; gap:.5rem; align-items:center; min-height:44px; margin:0; }
a { color:var(--accent); }
.sr-only { position:absolute; width:1px; height:1px; padding:0; margin:-1px; overflow:hidden; clip:rect(0,0,0,0); white-space:nowrap; border:0; }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en-GB">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(title)} · Tappet test payments</title><style>${STYLE}</style></head>
<body>
<header class="standin"><p><strong>TEST STAND-IN.</strong> This page comes from Tappet's local fake of the payment provider, used for the demo and for tests. No money moves, and the card details you type are neither checked nor kept.</p></header>
<main>
${body}
</main>
</body>
</html>`;
}

function sendPage(res: Response, status: number, title: string, body: string): void {
  res
    .status(status)
    .set({
      'Content-Type': 'text/html; charset=utf-8',
      'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'",
      'X-Content-Type-Options': 'nosniff',
      'Referrer-Policy': 'no-referrer',
      'Cache-Control': 'no-store',
    })
    .send(layout(title, body));
}

function notFound(res: Response, what: string): void {
  sendPage(res, 404, 'Not found', `<h1>Not found</h1><p>There is no ${esc(what)} at this address. It may have been reset; start again from Tappet.</p>`);
}

function tokenMatches(expected: string, given: unknown): boolean {
  if (typeof given !== 'string') return false;
  const a = Buffer.from(expected);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}

function staleForm(res: Response): void {
  sendPage(res, 403, 'Form expired', '<h1>This form has expired</h1><p>Go back, reload the page and try again.</p>');
}

/** Replaces Stripe's placeholder in a success URL. */
export function successUrl(rec: CheckoutSessionRecord): string {
  return (rec.session.success_url ?? '').replaceAll('{CHECKOUT_SESSION_ID}', rec.session.id);
}

// ---------------------------------------------------------------- checkout

const cardForm = z.object({
  token: z.string(),
  email: z.string().optional(),
  name: z.string().trim().min(1, 'Enter the name on the card.').max(100, 'Use at most 100 characters.'),
  card_number: z
    .string()
    .trim()
    .regex(/^[0-9 ]+$/, 'Use digits and spaces only.')
    .refine((s) => {
      const n = s.replace(/ /g, '').length;
      return n >= 12 && n <= 19;
    }, 'A card number has 12 to 19 digits.'),
  expiry: z
    .string()
    .trim()
    .regex(/^(0[1-9]|1[0-2]) ?\/ ?\d{2}$/, 'Use the form MM/YY, for example 12/30.'),
  cvc: z
    .string()
    .trim()
    .regex(/^\d{3,4}$/, 'The security code is 3 or 4 digits.'),
});
type CardForm = z.infer<typeof cardForm>;
type FieldErrors = Partial<Record<'email' | 'name' | 'card_number' | 'expiry' | 'cvc', string>>;

function field(name: keyof FieldErrors, label: string, value: string, errors: FieldErrors, attrs: string, hint?: string): string {
  const error = errors[name];
  const describedBy = [hint ? `${name}-hint` : '', error ? `${name}-error` : ''].filter(Boolean).join(' ');
  return `<div>
  <label for="${name}">${esc(label)}</label>
  ${hint ? `<p class="hint" id="${name}-hint">${esc(hint)}</p>` : ''}
  <input type="${name === 'email' ? 'email' : 'text'}" id="${name}" name="${name}" value="${esc(value)}" ${attrs}${describedBy ? ` aria-describedby="${describedBy}"` : ''}${error ? ' aria-invalid="true"' : ''}>
  ${error ? `<p class="field-error" id="${name}-error">${esc(error)}</p>` : ''}
</div>`;
}

function checkoutBody(billing: FakeBilling, store: FakeStripeStore, rec: CheckoutSessionRecord, values: Partial<CardForm>, errors: FieldErrors, alert?: string): string {
  const s = rec.session;
  const lines = billing.checkoutLineItems(rec);
  const currency = s.currency ?? 'gbp';
  const knownEmail = s.customer ? (store.customers.get(s.customer)?.email ?? null) : s.customer_email;
  const trialDays = rec.subscriptionData.trialPeriodDays;
  const trialEnd = rec.subscriptionData.trialEnd;
  const recurring = lines.find((l) => l.price.recurring);
  const rows = lines
    .map((l) => {
      const product = store.products.get(l.price.product);
      return `<tr><td>${esc(product?.name ?? l.description)}${l.price.nickname ? `<br><span class="hint">${esc(l.price.nickname)}</span>` : ''}</td><td class="num">${l.quantity}</td><td class="num">${esc(money(l.price.unit_amount ?? 0, currency))}<br><span class="hint">${esc(every(l.price))}</span></td><td class="num">${esc(money(l.amount_total, currency))}</td></tr>`;
    })
    .join('');
  const trialNote =
    s.mode === 'subscription' && (trialDays || trialEnd)
      ? `<p class="notice">Free trial${trialDays ? ` for ${trialDays} days` : ''}: nothing is charged today. The first charge of ${esc(money(s.amount_subtotal ?? 0, currency))} falls on ${esc(date(trialEnd ?? Math.floor(Date.now() / 1000) + (trialDays ?? 0) * 86_400))}.</p>`
      : '';
  const errorList = Object.entries(errors);
  const summary =
    alert || errorList.length > 0
      ? `<div class="alert" role="alert"><strong>${esc(alert ?? 'Please correct the details below.')}</strong>${errorList.length ? `<ul>${errorList.map(([k, m]) => `<li><a href="#${k}">${esc(m)}</a></li>`).join('')}</ul>` : ''}</div>`
      : '';
  const expYear = (new Date().getUTCFullYear() + 3) % 100;
  return `<h1>${s.mode === 'subscription' ? 'Confirm your subscription' : 'Confirm your payment'}</h1>
${summary}
<section aria-labelledby="order-heading">
  <table>
    <caption id="order-heading">What you are paying for</caption>
    <thead><tr><th scope="col">Item</th><th scope="col" class="num">Quantity</th><th scope="col" class="num">Price</th><th scope="col" class="num">Amount</th></tr></thead>
    <tbody>${rows}</tbody>
    <tfoot><tr><th scope="row" colspan="3">Due today</th><td class="num" data-testid="amount-due">${esc(money(s.amount_total ?? 0, currency))}</td></tr>
    ${recurring ? `<tr><th scope="row" colspan="3">Then</th><td class="num">${esc(money(s.amount_subtotal ?? 0, currency))} ${esc(every(recurring.price))}</td></tr>` : ''}</tfoot>
  </table>
  ${trialNote}
</section>
<section aria-labelledby="card-heading">
  <h2 id="card-heading">Test card</h2>
  <p class="hint">The fields come filled with a made-up card; any well-formed values work. To see a declined payment, use the test control <span class="mono">POST /_test/fail-next-payment</span> first.</p>
  <form method="post" action="/checkout/${esc(s.id)}/pay" novalidate>
    <input type="hidden" name="token" value="${esc(rec.formToken)}">
    ${knownEmail ? `<p>Billed to <strong>${esc(knownEmail)}</strong></p>` : field('email', 'E-mail address', values.email ?? '', errors, 'required autocomplete="email"', 'The receipt and the account go to this address.')}
    ${field('name', 'Name on card', values.name ?? PREFILLED_CARD.name, errors, 'required autocomplete="cc-name"')}
    ${field('card_number', 'Card number', values.card_number ?? PREFILLED_CARD.number, errors, 'required inputmode="numeric" autocomplete="cc-number" class="mono"')}
    <div class="row">
      ${field('expiry', 'Expiry date (MM/YY)', values.expiry ?? `12/${String(expYear).padStart(2, '0')}`, errors, 'required autocomplete="cc-exp" class="mono"')}
      ${field('cvc', 'Security code', values.cvc ?? PREFILLED_CARD.cvc, errors, 'required inputmode="numeric" autocomplete="cc-csc" class="mono"')}
    </div>
    <div class="actions"><button type="submit" class="primary">Pay</button><span class="hint">${esc(money(s.amount_total ?? 0, currency))} today</span></div>
  </form>
  ${
    s.cancel_url
      ? `<form method="post" action="/checkout/${esc(s.id)}/cancel"><input type="hidden" name="token" value="${esc(rec.formToken)}"><div class="actions"><button type="submit" class="secondary">Cancel</button><span class="hint">Go back without paying.</span></div></form>`
      : ''
  }
</section>`;
}

function closedCheckout(res: Response, rec: CheckoutSessionRecord, status: string): void {
  if (status === 'complete') {
    sendPage(res, 200, 'Payment complete', `<h1>Payment complete</h1><p>This checkout is already paid.</p><p><a href="${esc(successUrl(rec))}">Continue</a></p>`);
  } else {
    const back = rec.session.cancel_url ? `<p><a href="${esc(rec.session.cancel_url)}">Go back</a></p>` : '';
    sendPage(res, 410, 'Checkout expired', `<h1>This checkout has expired</h1><p>Start again from Tappet to get a new one.</p>${back}`);
  }
}

// ---------------------------------------------------------------- portal

const DONE_MESSAGES: Record<string, string> = {
  switched: 'Your plan has been changed.',
  cancel_scheduled: 'Your subscription will end at the end of the current period.',
  resumed: 'Your subscription will carry on renewing.',
  canceled: 'Your subscription has ended.',
  paid: 'Thank you: the invoice is paid.',
  payment_failed: 'The test card was declined; the invoice is still open.',
};

function subscriptionSection(billing: FakeBilling, store: FakeStripeStore, portal: PortalSessionRecord, sub: SubscriptionRecord): string {
  const item = sub.items[0];
  const price = item ? store.prices.get(item.price) : undefined;
  const product = price ? store.products.get(price.product) : undefined;
  const base = `/portal/${esc(portal.session.id)}/subscriptions/${esc(sub.id)}`;
  const token = `<input type="hidden" name="token" value="${esc(portal.formToken)}">`;
  const headingId = `h-${esc(sub.id)}`;
  const live = sub.status !== 'canceled';
  const open = [...store.invoices.values()].filter((i) => i.status === 'open' && i.parent?.subscription_details.subscription === sub.id);
  const facts = [
    ['Status', esc(STATUS_WORDS[sub.status] ?? sub.status)],
    ['Price', price ? `<span class="mono">${esc(money((price.unit_amount ?? 0) * (item?.quantity ?? 1), price.currency))}</span> ${esc(every(price))}` : '—'],
    ['Current period', item ? `${esc(date(item.current_period_start))} to ${esc(date(item.current_period_end))}` : '—'],
  ];
  if (sub.status === 'trialing') facts.push(['Trial ends', esc(date(sub.trial_end))]);
  if (live) facts.push([sub.cancel_at_period_end ? 'Ends on' : 'Renews on', esc(date(item?.current_period_end))]);
  else facts.push(['Ended on', esc(date(sub.ended_at))]);
  const dl = `<dl>${facts.map(([k, v]) => `<dt>${k}</dt><dd>${v}</dd>`).join('')}</dl>`;
  if (!live) return `<section aria-labelledby="${headingId}"><h2 id="${headingId}">${esc(product?.name ?? 'Subscription')}</h2>${dl}</section>`;

  const payForms = open
    .map(
      (inv) =>
        `<div class="alert"><p><strong>Payment of ${esc(money(inv.amount_remaining, inv.currency))} for invoice <span class="mono">${esc(inv.number)}</span> did not go through.</strong></p><form method="post" action="/portal/${esc(portal.session.id)}/invoices/${esc(inv.id)}/pay">${token}<button type="submit" class="primary">Pay ${esc(money(inv.amount_remaining, inv.currency))} now</button></form></div>`,
    )
    .join('');
  const options = billing.switchOptions(sub);
  const switchForm =
    options.length > 0
      ? `<form method="post" action="${base}/switch"><fieldset><legend>Change plan</legend>${options
          .map((o, i) => {
            const name = store.products.get(o.product)?.name ?? o.product;
            return `<label><input type="radio" name="price" value="${esc(o.id)}"${i === 0 ? ' required' : ''}> ${esc(name)}${o.nickname ? ` — ${esc(o.nickname)}` : ''}: <span class="mono">${esc(money(o.unit_amount ?? 0, o.currency))}</span> ${esc(every(o))}</label>`;
          })
          .join('')}<p class="hint">The new price applies from now; this test stand-in does not prorate.</p>${token}<button type="submit" class="primary">Switch plan</button></fieldset></form>`
      : '<p class="hint">No other plan is on offer.</p>';
  const cancelForms = sub.cancel_at_period_end
    ? `<form method="post" action="${base}/resume">${token}<div class="actions"><button type="submit" class="primary">Keep my subscription</button><span class="hint">Undo the cancellation; it renews on ${esc(date(item?.current_period_end))}.</span></div></form>`
    : `<form method="post" action="${base}/cancel-at-period-end">${token}<div class="actions"><button type="submit" class="secondary">Cancel at end of period</button><span class="hint">Keeps working until ${esc(date(item?.current_period_end))}, then ends.</span></div></form>`;
  const cancelNow = `<form method="post" action="${base}/cancel-now">${token}<fieldset><legend>End it now</legend><p class="hint">The subscription ends immediately. Nothing already paid is refunded.</p><label><input type="checkbox" name="confirm" value="yes" required> Yes, end my subscription now</label><button type="submit" class="danger">Cancel now</button></fieldset></form>`;
  return `<section aria-labelledby="${headingId}"><h2 id="${headingId}">${esc(product?.name ?? 'Subscription')}</h2>${payForms}${dl}${switchForm}${cancelForms}${cancelNow}</section>`;
}

function invoiceTable(invoices: InvoiceObject[]): string {
  if (invoices.length === 0) return '<p>No invoices yet.</p>';
  const rows = invoices
    .map(
      (i) =>
        `<tr><td class="mono">${esc(i.number)}</td><td>${esc(date(i.created))}</td><td class="num">${esc(money(i.total, i.currency))}</td><td>${esc(STATUS_WORDS[i.status ?? ''] ?? i.status)}</td><td><a href="/invoices/${esc(i.id)}">View<span class="sr-only"> invoice ${esc(i.number)}</span></a></td></tr>`,
    )
    .join('');
  return `<table><caption>Invoices</caption><thead><tr><th scope="col">Number</th><th scope="col">Date</th><th scope="col" class="num">Amount</th><th scope="col">Status</th><th scope="col"><span class="sr-only">Link</span></th></tr></thead><tbody>${rows}</tbody></table>`;
}

// ---------------------------------------------------------------- router

export interface PagesOptions {
  store: FakeStripeStore;
  billing: FakeBilling;
  /** Waits (bounded) for the first delivery of the events a page action produced. */
  settle: (emitted: Emitted) => Promise<void>;
}

/** Builds the router for the hosted pages. */
export function pagesRouter({ store, billing, settle }: PagesOptions): Router {
  const r = express.Router();
  const checkoutOf = (req: Request) => store.checkoutSessions.get(String(req.params.id));
  const portalOf = (req: Request) => store.portalSessions.get(String(req.params.id));

  r.get('/checkout/:id', (req, res) => {
    const rec = checkoutOf(req);
    if (!rec) return notFound(res, 'checkout');
    const status = billing.renderCheckoutSession(rec).status ?? 'open';
    if (status !== 'open') return closedCheckout(res, rec, status);
    sendPage(res, 200, 'Checkout', checkoutBody(billing, store, rec, {}, {}));
  });

  r.post('/checkout/:id/pay', async (req, res) => {
    const rec = checkoutOf(req);
    if (!rec) return notFound(res, 'checkout');
    const body = (req.body ?? {}) as Record<string, unknown>;
    if (!tokenMatches(rec.formToken, body.token)) return staleForm(res);
    const status = billing.renderCheckoutSession(rec).status ?? 'open';
    if (status !== 'open') return closedCheckout(res, rec, status);
    const values = Object.fromEntries(['email', 'name', 'card_number', 'expiry', 'cvc'].map((k) => [k, typeof body[k] === 'string' ? body[k] : ''])) as Partial<CardForm>;
    const parsed = cardForm.safeParse(body);
    const errors: FieldErrors = {};
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] as keyof FieldErrors;
        errors[key] ??= issue.message;
      }
    }
    const needsEmail = !rec.session.customer && !rec.session.customer_email;
    const email = values.email?.trim() ?? '';
    if (needsEmail && !z.email().safeParse(email).success) errors.email = 'Enter an e-mail address, like name@example.test.';
    if (!parsed.success || Object.keys(errors).length > 0) {
      return sendPage(res, 422, 'Checkout', checkoutBody(billing, store, rec, values, errors));
    }
    const [mm, yy] = parsed.data.expiry.split('/').map((x) => Number(x.trim())) as [number, number];
    const card: CardInput = { email: needsEmail ? email : null, name: parsed.data.name, number: parsed.data.card_number, expMonth: mm, expYear: 2000 + yy };
    const result = billing.payCheckout(rec, card);
    if (!result.ok) return sendPage(res, 402, 'Checkout', checkoutBody(billing, store, rec, values, {}, result.reason));
    await settle(result.emitted);
    res.redirect(303, successUrl(rec));
  });

  r.post('/checkout/:id/cancel', (req, res) => {
    const rec = checkoutOf(req);
    if (!rec) return notFound(res, 'checkout');
    if (!tokenMatches(rec.formToken, (req.body as Record<string, unknown> | undefined)?.token)) return staleForm(res);
    if (!rec.session.cancel_url) return sendPage(res, 400, 'Checkout', '<h1>No way back</h1><p>This checkout has no cancel address.</p>');
    res.redirect(303, rec.session.cancel_url);
  });

  r.get('/portal/:id', (req, res) => {
    const portal = portalOf(req);
    if (!portal) return notFound(res, 'billing portal');
    const customer = store.customers.get(portal.session.customer);
    const subs = [...store.subscriptions.values()].filter((s) => s.customer === portal.session.customer).reverse();
    const live = subs.filter((s) => s.status !== 'canceled');
    const ended = subs.filter((s) => s.status === 'canceled');
    const done = DONE_MESSAGES[String(req.query.done ?? '')];
    const invoices = [...store.invoices.values()].filter((i) => i.customer === portal.session.customer).reverse();
    const back = portal.session.return_url ? `<p><a href="${esc(portal.session.return_url)}">Back to Tappet</a></p>` : '';
    sendPage(
      res,
      200,
      'Billing',
      `<h1>Billing for ${esc(customer?.name || customer?.email || 'your account')}</h1>
${done ? `<p class="notice" role="status">${esc(done)}</p>` : ''}
${back}
${live.length ? live.map((s) => subscriptionSection(billing, store, portal, s)).join('') : '<section><h2>No current subscription</h2><p>Subscribe from Tappet to start one.</p></section>'}
${ended.length ? `<h2>Ended subscriptions</h2>${ended.map((s) => subscriptionSection(billing, store, portal, s)).join('')}` : ''}
<section aria-label="Invoices">${invoiceTable(invoices)}</section>
${back}`,
    );
  });

  /** Runs a portal action on one of the portal customer's subscriptions, then shows the portal again. */
  const subscriptionAction = (path: string, act: (sub: SubscriptionRecord, body: Record<string, unknown>) => { emitted: Emitted; done: string } | { error: string }) => {
    r.post(`/portal/:id/subscriptions/:subId/${path}`, async (req, res) => {
      const portal = portalOf(req);
      const sub = store.subscriptions.get(String(req.params.subId));
      if (!portal || !sub || sub.customer !== portal.session.customer) return notFound(res, 'subscription');
      const body = (req.body ?? {}) as Record<string, unknown>;
      if (!tokenMatches(portal.formToken, body.token)) return staleForm(res);
      if (sub.status === 'canceled') return sendPage(res, 409, 'Billing', `<h1>Already ended</h1><p>This subscription has ended.</p><p><a href="/portal/${esc(portal.session.id)}">Back to billing</a></p>`);
      const outcome = act(sub, body);
      if ('error' in outcome) return sendPage(res, 400, 'Billing', `<h1>That did not work</h1><p role="alert">${esc(outcome.error)}</p><p><a href="/portal/${esc(portal.session.id)}">Back to billing</a></p>`);
      await settle(outcome.emitted);
      res.redirect(303, `/portal/${portal.session.id}?done=${outcome.done}`);
    });
  };
  subscriptionAction('switch', (sub, body) => {
    const priceId = typeof body.price === 'string' ? body.price : '';
    if (!billing.switchOptions(sub).some((p) => p.id === priceId)) return { error: 'Choose one of the plans on offer.' };
    const item = sub.items[0]!;
    return { emitted: billing.updateSubscription(sub.id, { items: [{ id: item.id, price: priceId }], proration_behavior: 'none' }).emitted, done: 'switched' };
  });
  subscriptionAction('cancel-at-period-end', (sub) => ({ emitted: billing.updateSubscription(sub.id, { cancel_at_period_end: true }).emitted, done: 'cancel_scheduled' }));
  subscriptionAction('resume', (sub) => ({ emitted: billing.updateSubscription(sub.id, { cancel_at_period_end: false }).emitted, done: 'resumed' }));
  subscriptionAction('cancel-now', (sub, body) => {
    if (body.confirm !== 'yes') return { error: 'Tick the box to confirm that the subscription should end now.' };
    return { emitted: billing.cancelSubscription(sub.id, {}).emitted, done: 'canceled' };
  });

  r.post('/portal/:id/invoices/:invoiceId/pay', async (req, res) => {
    const portal = portalOf(req);
    const invoice = store.invoices.get(String(req.params.invoiceId));
    if (!portal || !invoice || invoice.customer !== portal.session.customer) return notFound(res, 'invoice');
    if (!tokenMatches(portal.formToken, (req.body as Record<string, unknown> | undefined)?.token)) return staleForm(res);
    if (invoice.status !== 'open') return res.redirect(303, `/portal/${portal.session.id}`);
    const { paid, emitted } = billing.payInvoice(invoice.id);
    await settle(emitted);
    res.redirect(303, `/portal/${portal.session.id}?done=${paid ? 'paid' : 'payment_failed'}`);
  });

  r.get('/invoices/:id', (req, res) => {
    const inv = store.invoices.get(String(req.params.id));
    if (!inv) return notFound(res, 'invoice');
    const rows = inv.lines.data.map((l) => `<tr><td>${esc(l.description)}</td><td>${esc(date(l.period.start))} to ${esc(date(l.period.end))}</td><td class="num">${esc(money(l.amount, l.currency))}</td></tr>`).join('');
    sendPage(
      res,
      200,
      `Invoice ${inv.number ?? ''}`,
      `<h1>Invoice <span class="mono">${esc(inv.number)}</span></h1>
<section><dl><dt>Status</dt><dd>${esc(STATUS_WORDS[inv.status ?? ''] ?? inv.status)}</dd><dt>Billed to</dt><dd>${esc(inv.customer_name ?? inv.customer_email ?? inv.customer)}</dd><dt>Issued</dt><dd>${esc(date(inv.created))}</dd>${inv.status_transitions.paid_at ? `<dt>Paid</dt><dd>${esc(date(inv.status_transitions.paid_at))}</dd>` : ''}</dl></section>
<section><table><caption>Lines</caption><thead><tr><th scope="col">Description</th><th scope="col">Period</th><th scope="col" class="num">Amount</th></tr></thead><tbody>${rows}</tbody>
<tfoot><tr><th scope="row" colspan="2">Total</th><td class="num">${esc(money(inv.total, inv.currency))}</td></tr><tr><th scope="row" colspan="2">Still to pay</th><td class="num">${esc(money(inv.amount_remaining, inv.currency))}</td></tr></tfoot></table></section>`,
    );
  });

  return r;
}
