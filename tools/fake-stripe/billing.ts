// What the fake does, independent of HTTP: catalogue, checkout, subscriptions, invoices, payment
// attempts and the events each change produces. Routes and hosted pages call into this.
import Stripe from 'stripe';
import { invalid, noSuch } from './errors.ts';
import type { CheckoutSessionCreate, MetadataParam, PriceDataParam, SubscriptionUpdate } from './params.ts';
import {
  type CheckoutLineItemObject,
  type CheckoutSessionObject,
  type CheckoutSessionRecord,
  type CustomerObject,
  type EventRecord,
  type EventType,
  type FakeStripeStore,
  type InvoiceLineObject,
  type InvoiceObject,
  type Metadata,
  type PaymentIntentObject,
  type PaymentMethodObject,
  type PlanObject,
  type PriceObject,
  type ProductObject,
  type SubscriptionItemObject,
  type SubscriptionObject,
  type SubscriptionRecord,
  newId,
  nowSeconds,
} from './store.ts';
import type { WebhookDispatcher } from './webhooks.ts';

const DAY = 86_400;

/** Who asked for a change: an API request (with its ids) or a hosted page / test control. */
export interface RequestInfo {
  id: string | null;
  idempotencyKey: string | null;
}
const NO_REQUEST: RequestInfo = { id: null, idempotencyKey: null };

/** The events one operation produced; `delivered` settles once each has had its first attempt. */
export interface Emitted {
  events: EventRecord[];
  delivered: Promise<void>;
}

/** Applies a metadata parameter the way Stripe does: '' clears, a key set to '' is removed. */
export function applyMetadata(current: Metadata, param: MetadataParam | undefined): Metadata {
  if (param === undefined) return current;
  if (param === '') return {};
  const next = { ...current };
  for (const [k, v] of Object.entries(param)) {
    if (v === '') delete next[k];
    else next[k] = v;
  }
  return next;
}

/** Adds `count` intervals to a unix time, clamping to the end of shorter months like Stripe. */
export function addInterval(ts: number, interval: string, count: number): number {
  if (interval === 'day') return ts + count * DAY;
  if (interval === 'week') return ts + count * 7 * DAY;
  if (interval !== 'month' && interval !== 'year') throw new Error(`Unknown billing interval: ${interval}`);
  const months = interval === 'year' ? count * 12 : count;
  const d = new Date(ts * 1000);
  const day = d.getUTCDate();
  d.setUTCDate(1);
  d.setUTCMonth(d.getUTCMonth() + months);
  const lastDay = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 0)).getUTCDate();
  d.setUTCDate(Math.min(day, lastDay));
  return Math.floor(d.getTime() / 1000);
}

function snapshot<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

/** Top-level fields whose value changed, with their old values (Stripe's previous_attributes). */
function changedFields(before: object, after: object): Record<string, unknown> {
  const prev: Record<string, unknown> = {};
  const a = before as Record<string, unknown>;
  const b = after as Record<string, unknown>;
  for (const key of Object.keys(b)) {
    if (JSON.stringify(a[key]) !== JSON.stringify(b[key])) prev[key] = a[key] ?? null;
  }
  return prev;
}

export interface CardInput {
  email: string | null;
  name: string;
  number: string;
  expMonth: number;
  expYear: number;
}

export type PayResult = { ok: true; emitted: Emitted } | { ok: false; reason: string };

/** The fake's behaviour. One instance per running fake. */
export class FakeBilling {
  constructor(
    private readonly store: FakeStripeStore,
    private readonly dispatcher: WebhookDispatcher,
    private readonly publicUrl: () => string,
  ) {}

  // ---------------------------------------------------------------- lookups

  customer(id: string, param = 'id'): CustomerObject {
    const c = this.store.customers.get(id);
    if (!c) throw noSuch('cus', id, param);
    return c;
  }
  product(id: string, param = 'id'): ProductObject {
    const p = this.store.products.get(id);
    if (!p) throw noSuch('prod', id, param);
    return p;
  }
  price(id: string, param = 'id'): PriceObject {
    const p = this.store.prices.get(id);
    if (!p) throw noSuch('price', id, param);
    return p;
  }
  subscriptionRecord(id: string, param = 'id'): SubscriptionRecord {
    const s = this.store.subscriptions.get(id);
    if (!s) throw noSuch('sub', id, param);
    return s;
  }
  invoice(id: string, param = 'id'): InvoiceObject {
    const i = this.store.invoices.get(id);
    if (!i) throw noSuch('in', id, param);
    return i;
  }
  checkoutRecord(id: string): CheckoutSessionRecord {
    const r = this.store.checkoutSessions.get(id);
    if (!r) throw noSuch('cs', id);
    return r;
  }

  // ---------------------------------------------------------------- rendering

  planOf(price: PriceObject): PlanObject {
    return {
      id: price.id,
      object: 'plan',
      active: price.active,
      amount: price.unit_amount,
      amount_decimal: price.unit_amount_decimal,
      billing_scheme: 'per_unit',
      created: price.created,
      currency: price.currency,
      interval: price.recurring?.interval ?? 'month',
      interval_count: price.recurring?.interval_count ?? 1,
      livemode: false,
      metadata: price.metadata,
      meter: null,
      nickname: price.nickname,
      product: price.product,
      tiers_mode: null,
      transform_usage: null,
      trial_period_days: price.recurring?.trial_period_days ?? null,
      usage_type: 'licensed',
    };
  }

  /** The subscription as the API returns it, items carrying their current price objects. */
  renderSubscription(rec: SubscriptionRecord): SubscriptionObject {
    const { items, ...rest } = rec;
    const data: SubscriptionItemObject[] = items.map((it) => {
      const price = this.price(it.price);
      return {
        id: it.id,
        object: 'subscription_item',
        billing_thresholds: null,
        created: it.created,
        current_period_end: it.current_period_end,
        current_period_start: it.current_period_start,
        current_trial: null,
        discounts: [],
        metadata: it.metadata,
        plan: this.planOf(price),
        price,
        quantity: it.quantity,
        subscription: rec.id,
        tax_rates: [],
      };
    });
    return snapshot({ ...rest, items: { object: 'list', data, has_more: false, url: `/v1/subscription_items?subscription=${rec.id}` } });
  }

  renderCheckoutSession(rec: CheckoutSessionRecord): CheckoutSessionObject {
    const s = rec.session;
    if (s.status === 'open' && s.expires_at <= nowSeconds()) {
      s.status = 'expired';
    }
    return snapshot({ ...s, url: s.status === 'open' ? s.url : null });
  }

  checkoutLineItems(rec: CheckoutSessionRecord): CheckoutLineItemObject[] {
    return rec.lines.map((line) => {
      const price = this.price(line.price);
      const amount = (price.unit_amount ?? 0) * line.quantity;
      return {
        id: line.id,
        object: 'item',
        adjustable_quantity: null,
        amount_discount: 0,
        amount_subtotal: amount,
        amount_tax: 0,
        amount_total: amount,
        currency: price.currency,
        description: this.store.products.get(price.product)?.name ?? null,
        metadata: {},
        price: snapshot(price),
        quantity: line.quantity,
      };
    });
  }

  /** Any stored object by id, rendered, for expansion. */
  resolveForExpand(id: string): unknown {
    if (id.startsWith('sub_')) {
      const rec = this.store.subscriptions.get(id);
      return rec ? this.renderSubscription(rec) : undefined;
    }
    if (id.startsWith('cs_')) {
      const rec = this.store.checkoutSessions.get(id);
      return rec ? this.renderCheckoutSession(rec) : undefined;
    }
    const found = this.store.findById(id);
    return found ? snapshot(found.value) : undefined;
  }

  // ---------------------------------------------------------------- events

  private emit(pending: EventRecord[], type: EventType, object: unknown, request: RequestInfo, previous?: Record<string, unknown>): void {
    const record: EventRecord = {
      event: {
        id: newId('evt'),
        object: 'event',
        api_version: Stripe.API_VERSION,
        created: nowSeconds(),
        data: { object: snapshot(object), ...(previous && Object.keys(previous).length > 0 ? { previous_attributes: snapshot(previous) } : {}) },
        livemode: false,
        pending_webhooks: 1,
        request: { id: request.id, idempotency_key: request.idempotencyKey },
        type,
      },
      delivery: { status: 'pending', attempts: [], nextAttemptAt: null },
    };
    this.store.events.push(record);
    pending.push(record);
  }

  private send(pending: EventRecord[]): Emitted {
    const delivered = Promise.all(pending.map((r) => this.dispatcher.enqueue(r))).then(() => undefined);
    return { events: pending, delivered };
  }

  /** Sends an already recorded event again. */
  resend(eventId: string): Promise<void> {
    const record = this.store.events.find((r) => r.event.id === eventId);
    if (!record) throw noSuch('evt', eventId);
    return this.dispatcher.resend(record);
  }

  // ---------------------------------------------------------------- catalogue

  createCustomer(p: { email?: string; name?: string; phone?: string; description?: string; metadata?: MetadataParam }): CustomerObject {
    const customer: CustomerObject = {
      id: newId('cus', 14),
      object: 'customer',
      address: null,
      balance: 0,
      created: nowSeconds(),
      currency: null,
      default_source: null,
      delinquent: false,
      description: p.description ?? null,
      email: p.email || null,
      invoice_prefix: newId('x', 8).slice(2).toUpperCase(),
      invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
      livemode: false,
      metadata: applyMetadata({}, p.metadata),
      name: p.name ?? null,
      phone: p.phone ?? null,
      preferred_locales: [],
      shipping: null,
      tax_exempt: 'none',
      test_clock: null,
    };
    this.store.customers.set(customer.id, customer);
    return customer;
  }

  updateCustomer(
    id: string,
    p: { email?: string; name?: string; phone?: string; description?: string; metadata?: MetadataParam; invoice_settings?: { default_payment_method?: string } },
  ): CustomerObject {
    const c = this.customer(id);
    if (p.email !== undefined) c.email = p.email || null;
    if (p.name !== undefined) c.name = p.name || null;
    if (p.phone !== undefined) c.phone = p.phone || null;
    if (p.description !== undefined) c.description = p.description || null;
    c.metadata = applyMetadata(c.metadata, p.metadata);
    const pm = p.invoice_settings?.default_payment_method;
    if (pm !== undefined) {
      if (pm !== '' && !this.store.paymentMethods.has(pm)) throw noSuch('pm', pm, 'invoice_settings[default_payment_method]');
      c.invoice_settings.default_payment_method = pm || null;
    }
    return c;
  }

  createProduct(p: { id?: string; name: string; active?: boolean; description?: string; metadata?: MetadataParam }): ProductObject {
    const id = p.id ?? newId('prod', 14);
    if (this.store.products.has(id)) throw invalid('id', `Product already exists: '${id}'`, 'resource_already_exists');
    const now = nowSeconds();
    const product: ProductObject = {
      id,
      object: 'product',
      active: p.active ?? true,
      created: now,
      default_price: null,
      description: p.description ?? null,
      images: [],
      livemode: false,
      marketing_features: [],
      metadata: applyMetadata({}, p.metadata),
      name: p.name,
      package_dimensions: null,
      shippable: null,
      statement_descriptor: null,
      tax_code: null,
      type: 'service',
      unit_label: null,
      updated: now,
      url: null,
    };
    this.store.products.set(id, product);
    return product;
  }

  updateProduct(id: string, p: { name?: string; active?: boolean; description?: string; metadata?: MetadataParam }): ProductObject {
    const product = this.product(id);
    if (p.name !== undefined) product.name = p.name;
    if (p.active !== undefined) product.active = p.active;
    if (p.description !== undefined) product.description = p.description || null;
    product.metadata = applyMetadata(product.metadata, p.metadata);
    product.updated = nowSeconds();
    return product;
  }

  private claimLookupKey(key: string, transfer: boolean | undefined): void {
    for (const other of this.store.prices.values()) {
      if (other.lookup_key !== key) continue;
      if (!transfer) {
        throw invalid('lookup_key', `A price (\`${other.id}\`) already uses the lookup key \`${key}\`; pass transfer_lookup_key=true to move it.`, 'lookup_key_in_use');
      }
      other.lookup_key = null;
    }
  }

  createPrice(p: {
    currency: string;
    unit_amount: number;
    product?: string;
    product_data?: { name: string; metadata?: MetadataParam };
    recurring?: { interval: 'day' | 'week' | 'month' | 'year'; interval_count?: number; trial_period_days?: number };
    lookup_key?: string;
    transfer_lookup_key?: boolean;
    nickname?: string;
    active?: boolean;
    metadata?: MetadataParam;
    tax_behavior?: 'exclusive' | 'inclusive' | 'unspecified';
  }): PriceObject {
    const productId = p.product ?? this.createProduct({ name: p.product_data?.name ?? 'Unnamed', metadata: p.product_data?.metadata }).id;
    const product = this.product(productId, 'product');
    if (p.lookup_key) this.claimLookupKey(p.lookup_key, p.transfer_lookup_key);
    const price: PriceObject = {
      id: newId('price'),
      object: 'price',
      active: p.active ?? true,
      billing_scheme: 'per_unit',
      created: nowSeconds(),
      currency: p.currency,
      custom_unit_amount: null,
      livemode: false,
      lookup_key: p.lookup_key ?? null,
      metadata: applyMetadata({}, p.metadata),
      nickname: p.nickname ?? null,
      product: product.id,
      recurring: p.recurring
        ? {
            interval: p.recurring.interval,
            interval_count: p.recurring.interval_count ?? 1,
            meter: null,
            trial_period_days: p.recurring.trial_period_days ?? null,
            usage_type: 'licensed',
          }
        : null,
      tax_behavior: p.tax_behavior ?? 'unspecified',
      tiers_mode: null,
      transform_quantity: null,
      type: p.recurring ? 'recurring' : 'one_time',
      unit_amount: p.unit_amount,
      unit_amount_decimal: String(p.unit_amount),
    };
    this.store.prices.set(price.id, price);
    if (!product.default_price) product.default_price = price.id;
    return price;
  }

  updatePrice(id: string, p: { active?: boolean; lookup_key?: string; transfer_lookup_key?: boolean; nickname?: string; metadata?: MetadataParam }): PriceObject {
    const price = this.price(id);
    if (p.lookup_key !== undefined && p.lookup_key !== price.lookup_key) {
      if (p.lookup_key) this.claimLookupKey(p.lookup_key, p.transfer_lookup_key);
      price.lookup_key = p.lookup_key || null;
    }
    if (p.active !== undefined) price.active = p.active;
    if (p.nickname !== undefined) price.nickname = p.nickname || null;
    price.metadata = applyMetadata(price.metadata, p.metadata);
    return price;
  }

  /** Inline `price_data` makes a price of its own that is not offered anywhere else. */
  private priceFromData(data: PriceDataParam): PriceObject {
    const productId = data.product ?? this.createProduct({ name: data.product_data!.name, description: data.product_data!.description, metadata: data.product_data!.metadata }).id;
    const price = this.createPrice({
      currency: data.currency,
      unit_amount: data.unit_amount,
      product: productId,
      recurring: data.recurring,
      tax_behavior: data.tax_behavior,
    });
    price.active = false;
    return price;
  }

  // ---------------------------------------------------------------- checkout

  createCheckoutSession(p: CheckoutSessionCreate): CheckoutSessionRecord {
    if (p.customer) this.customer(p.customer, 'customer');
    const now = nowSeconds();
    // Check every referenced price before creating inline ones, so a refused request leaves nothing behind.
    p.line_items.forEach((li, i) => {
      if (li.price) {
        const price = this.price(li.price, `line_items[${i}][price]`);
        if (!price.active) throw invalid(`line_items[${i}][price]`, `The price \`${price.id}\` is not active.`, 'price_inactive');
      }
    });
    const lines = p.line_items.map((li) => {
      const price = li.price ? this.price(li.price) : this.priceFromData(li.price_data!);
      return { id: newId('li'), price: price.id, quantity: li.quantity ?? 1 };
    });
    const prices = lines.map((l) => this.price(l.price));
    const currency = prices[0]!.currency;
    prices.forEach((price, i) => {
      const param = `line_items[${i}][price]`;
      if (price.currency !== currency) throw invalid(param, 'All line items must share one currency.');
      if (p.mode === 'payment' && price.type === 'recurring') throw invalid(param, 'mode=payment takes one-time prices only; use mode=subscription for recurring prices.');
    });
    if (p.mode === 'subscription') {
      const recurring = prices.filter((pr) => pr.recurring);
      if (recurring.length === 0) throw invalid('line_items', 'mode=subscription needs at least one recurring price.');
      const first = recurring[0]!.recurring!;
      if (recurring.some((pr) => pr.recurring!.interval !== first.interval || pr.recurring!.interval_count !== first.interval_count)) {
        throw invalid('line_items', 'All recurring prices in one subscription must share their billing interval.');
      }
      if (prices.some((pr) => !pr.recurring)) throw invalid('line_items', 'The local fake does not support one-time prices inside a subscription checkout.');
    }
    const trialEnd = p.subscription_data?.trial_end;
    if (trialEnd !== undefined && trialEnd < now + 2 * DAY) throw invalid('subscription_data[trial_end]', 'trial_end must be at least 48 hours in the future.');
    const expiresAt = p.expires_at ?? now + DAY;
    if (expiresAt < now + 30 * 60 || expiresAt > now + DAY) throw invalid('expires_at', 'expires_at must be between 30 minutes and 24 hours from now.');
    const subtotal = lines.reduce((sum, l) => sum + (this.price(l.price).unit_amount ?? 0) * l.quantity, 0);
    const trialing = p.mode === 'subscription' && (p.subscription_data?.trial_period_days !== undefined || trialEnd !== undefined);
    const id = newId('cs_test', 58);
    const session: CheckoutSessionObject = {
      id,
      object: 'checkout.session',
      allow_promotion_codes: p.allow_promotion_codes ?? null,
      amount_subtotal: subtotal,
      amount_total: trialing ? 0 : subtotal,
      billing_address_collection: p.billing_address_collection ?? null,
      cancel_url: p.cancel_url ?? null,
      client_reference_id: p.client_reference_id ?? null,
      created: now,
      currency,
      customer: p.customer ?? null,
      customer_creation: p.customer ? null : p.mode === 'subscription' ? 'always' : (p.customer_creation ?? 'if_required'),
      customer_details: null,
      customer_email: p.customer ? null : (p.customer_email ?? null),
      expires_at: expiresAt,
      invoice: null,
      livemode: false,
      locale: null,
      metadata: applyMetadata({}, p.metadata),
      mode: p.mode,
      payment_intent: null,
      payment_method_collection: p.mode === 'subscription' ? (p.payment_method_collection ?? 'always') : null,
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      subscription: null,
      success_url: p.success_url,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: 'hosted',
      url: `${this.publicUrl()}/checkout/${id}`,
    };
    const rec: CheckoutSessionRecord = {
      session,
      lines,
      formToken: newId('tok', 32),
      subscriptionData: {
        trialPeriodDays: p.subscription_data?.trial_period_days ?? null,
        trialEnd: trialEnd ?? null,
        metadata: applyMetadata({}, p.subscription_data?.metadata),
        description: p.subscription_data?.description ?? null,
      },
      paymentIntentData: { metadata: applyMetadata({}, p.payment_intent_data?.metadata), description: p.payment_intent_data?.description ?? null },
    };
    this.store.checkoutSessions.set(id, rec);
    return rec;
  }

  /** Takes one pending forced failure for this customer (or a global one), if any. */
  private consumeFailure(customerId: string | null): boolean {
    const own = customerId ? (this.store.failures.customers.get(customerId) ?? 0) : 0;
    if (customerId && own > 0) {
      if (own === 1) this.store.failures.customers.delete(customerId);
      else this.store.failures.customers.set(customerId, own - 1);
      return true;
    }
    if (this.store.failures.global > 0) {
      this.store.failures.global -= 1;
      return true;
    }
    return false;
  }

  private createPaymentMethod(customerId: string | null, card: CardInput): PaymentMethodObject {
    const digits = card.number.replace(/\D/g, '');
    const pm: PaymentMethodObject = {
      id: newId('pm'),
      object: 'payment_method',
      billing_details: { address: null, email: card.email, name: card.name, phone: null, tax_id: null },
      created: nowSeconds(),
      customer: customerId,
      livemode: false,
      metadata: {},
      type: 'card',
      card: { brand: 'unknown', display_brand: 'test_card', last4: digits.slice(-4), exp_month: card.expMonth, exp_year: card.expYear, funding: 'credit', country: null },
    };
    this.store.paymentMethods.set(pm.id, pm);
    return pm;
  }

  /** The hosted page's Pay button. A pending forced failure declines the card and changes nothing. */
  payCheckout(rec: CheckoutSessionRecord, card: CardInput): PayResult {
    const s = rec.session;
    if (this.renderCheckoutSession(rec).status !== 'open') return { ok: false, reason: 'This checkout is no longer open.' };
    const email = s.customer ? this.customer(s.customer).email : (s.customer_email ?? card.email);
    if (this.consumeFailure(s.customer)) return { ok: false, reason: 'The test card was declined (a payment failure was requested through the test controls).' };
    const pending: EventRecord[] = [];
    const now = nowSeconds();

    let customer = s.customer ? this.customer(s.customer) : null;
    if (!customer && (s.mode === 'subscription' || s.customer_creation === 'always')) {
      customer = this.createCustomer({ email: email ?? undefined, name: card.name });
    }
    const pm = this.createPaymentMethod(customer?.id ?? null, { ...card, email });
    s.customer = customer?.id ?? null;
    s.customer_details = { address: null, business_name: null, email, individual_name: null, name: card.name, phone: null, tax_exempt: 'none', tax_ids: [] };
    s.status = 'complete';

    if (s.mode === 'subscription') {
      const c = customer!;
      if (!c.invoice_settings.default_payment_method) c.invoice_settings.default_payment_method = pm.id;
      const { sub, invoice } = this.startSubscription(rec, c, pm.id, now);
      s.subscription = sub.id;
      s.invoice = invoice.id;
      s.payment_status = invoice.amount_due === 0 ? 'no_payment_required' : 'paid';
      this.emit(pending, 'customer.subscription.created', this.renderSubscription(sub), NO_REQUEST);
      this.emit(pending, 'invoice.paid', invoice, NO_REQUEST);
    } else {
      const pi: PaymentIntentObject = {
        id: newId('pi'),
        object: 'payment_intent',
        amount: s.amount_total ?? 0,
        amount_capturable: 0,
        amount_received: s.amount_total ?? 0,
        canceled_at: null,
        cancellation_reason: null,
        capture_method: 'automatic',
        client_secret: null,
        confirmation_method: 'automatic',
        created: now,
        currency: s.currency ?? 'gbp',
        customer: customer?.id ?? null,
        description: rec.paymentIntentData.description,
        last_payment_error: null,
        latest_charge: null,
        livemode: false,
        metadata: rec.paymentIntentData.metadata,
        next_action: null,
        payment_method: pm.id,
        payment_method_types: ['card'],
        receipt_email: email,
        status: 'succeeded',
      };
      this.store.paymentIntents.set(pi.id, pi);
      s.payment_intent = pi.id;
      s.payment_status = 'paid';
    }
    this.emit(pending, 'checkout.session.completed', this.renderCheckoutSession(rec), NO_REQUEST);
    return { ok: true, emitted: this.send(pending) };
  }

  private startSubscription(rec: CheckoutSessionRecord, customer: CustomerObject, paymentMethod: string, now: number): { sub: SubscriptionRecord; invoice: InvoiceObject } {
    const { trialPeriodDays, trialEnd: requestedTrialEnd } = rec.subscriptionData;
    const trialEnd = requestedTrialEnd ?? (trialPeriodDays ? now + trialPeriodDays * DAY : null);
    const firstPrice = this.price(rec.lines[0]!.price);
    const periodEnd = trialEnd ?? addInterval(now, firstPrice.recurring!.interval, firstPrice.recurring!.interval_count);
    const sub: SubscriptionRecord = {
      id: newId('sub'),
      object: 'subscription',
      application: null,
      application_fee_percent: null,
      automatic_tax: { disabled_reason: null, enabled: false, liability: null },
      billing_cycle_anchor: trialEnd ?? now,
      billing_cycle_anchor_config: null,
      billing_mode: { flexible: null, type: 'classic' },
      billing_thresholds: null,
      cancel_at: null,
      cancel_at_period_end: false,
      canceled_at: null,
      cancellation_details: { comment: null, feedback: null, feedback_option: null, reason: null },
      collection_method: 'charge_automatically',
      created: now,
      currency: firstPrice.currency,
      customer: customer.id,
      customer_account: null,
      days_until_due: null,
      default_payment_method: paymentMethod,
      default_source: null,
      description: rec.subscriptionData.description,
      discounts: [],
      ended_at: null,
      invoice_settings: { account_tax_ids: null, custom_fields: null, description: null, footer: null, issuer: { type: 'self' } },
      items: rec.lines.map((l) => ({
        id: newId('si', 14),
        created: now,
        price: l.price,
        quantity: l.quantity,
        current_period_start: now,
        current_period_end: periodEnd,
        metadata: {},
      })),
      latest_invoice: null,
      livemode: false,
      metadata: rec.subscriptionData.metadata,
      next_pending_invoice_item_invoice: null,
      on_behalf_of: null,
      pause_collection: null,
      pending_invoice_item_interval: null,
      pending_setup_intent: null,
      pending_update: null,
      schedule: null,
      start_date: now,
      status: trialEnd ? 'trialing' : 'active',
      test_clock: null,
      transfer_data: null,
      trial_end: trialEnd,
      trial_settings: { end_behavior: { billing_cycle_anchor: null, missing_payment_method: 'create_invoice' } },
      trial_start: trialEnd ? now : null,
    };
    this.store.subscriptions.set(sub.id, sub);
    const invoice = this.createInvoice(sub, 'subscription_create', now, trialEnd !== null);
    this.markPaid(invoice, now);
    sub.latest_invoice = invoice.id;
    return { sub, invoice };
  }

  // ---------------------------------------------------------------- invoices

  private createInvoice(sub: SubscriptionRecord, reason: 'subscription_create' | 'subscription_cycle', now: number, trial: boolean): InvoiceObject {
    const customer = this.customer(sub.customer);
    const id = newId('in');
    const lines: InvoiceLineObject[] = sub.items.map((it) => {
      const price = this.price(it.price);
      const product = this.product(price.product);
      const amount = trial ? 0 : (price.unit_amount ?? 0) * it.quantity;
      return {
        id: newId('il'),
        object: 'line_item',
        amount,
        currency: price.currency,
        description: trial ? `Trial period for ${product.name}` : `${it.quantity} × ${product.name}`,
        discount_amounts: [],
        discountable: true,
        discounts: [],
        invoice: id,
        livemode: false,
        metadata: {},
        parent: {
          type: 'subscription_item_details',
          invoice_item_details: null,
          subscription_item_details: { invoice_item: null, proration: false, proration_details: { credited_items: null }, subscription: sub.id, subscription_item: it.id },
        },
        period: { start: it.current_period_start, end: it.current_period_end },
        pretax_credit_amounts: [],
        pricing: { type: 'price_details', price_details: { price: price.id, product: product.id }, unit_amount_decimal: price.unit_amount_decimal },
        quantity: it.quantity,
        subscription: sub.id,
        subtotal: amount,
        taxes: [],
      };
    });
    const total = lines.reduce((s, l) => s + l.amount, 0);
    this.store.invoiceSequence += 1;
    const invoice: InvoiceObject = {
      id,
      object: 'invoice',
      account_country: 'GB',
      account_name: 'Tappet (local test stand-in)',
      amount_due: total,
      amount_overpaid: 0,
      amount_paid: 0,
      amount_remaining: total,
      amount_shipping: 0,
      attempt_count: 0,
      attempted: false,
      auto_advance: true,
      billing_reason: reason,
      collection_method: 'charge_automatically',
      created: now,
      currency: sub.currency,
      customer: customer.id,
      customer_email: customer.email,
      customer_name: customer.name ?? null,
      default_payment_method: null,
      description: null,
      discounts: [],
      due_date: null,
      effective_at: now,
      ending_balance: 0,
      hosted_invoice_url: `${this.publicUrl()}/invoices/${id}`,
      invoice_pdf: null,
      lines: { object: 'list', data: lines, has_more: false, url: `/v1/invoices/${id}/lines` },
      livemode: false,
      metadata: {},
      next_payment_attempt: null,
      number: `${customer.invoice_prefix ?? 'TEST'}-${String(this.store.invoiceSequence).padStart(4, '0')}`,
      parent: { type: 'subscription_details', quote_details: null, subscription_details: { metadata: sub.metadata, subscription: sub.id } },
      period_end: sub.items[0]?.current_period_end ?? now,
      period_start: sub.items[0]?.current_period_start ?? now,
      starting_balance: 0,
      status: 'open',
      status_transitions: { finalized_at: now, marked_uncollectible_at: null, paid_at: null, voided_at: null },
      subtotal: total,
      subtotal_excluding_tax: total,
      test_clock: null,
      total,
      total_excluding_tax: total,
      webhooks_delivered_at: now,
    };
    this.store.invoices.set(id, invoice);
    return invoice;
  }

  private markPaid(invoice: InvoiceObject, now: number): void {
    invoice.status = 'paid';
    invoice.attempted = true;
    invoice.attempt_count += invoice.amount_due > 0 ? 1 : 0;
    invoice.amount_paid = invoice.amount_due;
    invoice.amount_remaining = 0;
    invoice.next_payment_attempt = null;
    invoice.status_transitions.paid_at = now;
  }

  private markFailed(invoice: InvoiceObject, now: number, final: boolean): void {
    invoice.status = 'open';
    invoice.attempted = true;
    invoice.attempt_count += 1;
    invoice.next_payment_attempt = final ? null : now + 3 * DAY;
  }

  /**
   * Pays an open invoice with the card on file (the API's invoices.pay, the portal's button, a test
   * control). A pending forced failure declines it. Paying the last open invoice of a past-due or
   * unpaid subscription makes it active again.
   */
  payInvoice(invoiceId: string, request: RequestInfo = NO_REQUEST): { paid: boolean; invoice: InvoiceObject; emitted: Emitted } {
    const invoice = this.invoice(invoiceId);
    if (invoice.status !== 'open') throw invalid('invoice', `Invoice ${invoice.id} is ${invoice.status ?? 'not open'}; only open invoices can be paid.`, 'invoice_not_open');
    const pending: EventRecord[] = [];
    const now = nowSeconds();
    const subId = invoice.parent?.subscription_details.subscription ?? null;
    const sub = subId ? this.store.subscriptions.get(subId) : undefined;
    const before = sub ? this.renderSubscription(sub) : null;
    if (this.consumeFailure(invoice.customer)) {
      this.markFailed(invoice, now, false);
      this.emit(pending, 'invoice.payment_failed', invoice, request);
      return { paid: false, invoice, emitted: this.send(pending) };
    }
    this.markPaid(invoice, now);
    this.emit(pending, 'invoice.paid', invoice, request);
    if (sub && before && (sub.status === 'past_due' || sub.status === 'unpaid')) {
      const stillOpen = [...this.store.invoices.values()].some((i) => i.status === 'open' && i.parent?.subscription_details.subscription === sub.id);
      if (!stillOpen) {
        sub.status = 'active';
        const after = this.renderSubscription(sub);
        this.emit(pending, 'customer.subscription.updated', after, request, changedFields(before, after));
      }
    }
    return { paid: true, invoice, emitted: this.send(pending) };
  }

  // ---------------------------------------------------------------- subscription lifecycle

  private requireLive(sub: SubscriptionRecord): void {
    if (sub.status === 'canceled') throw invalid('subscription', `Subscription ${sub.id} is canceled.`, 'subscription_canceled');
  }

  private endSubscription(sub: SubscriptionRecord, now: number, details: { comment?: string; feedback?: string }, pending: EventRecord[], request: RequestInfo): void {
    sub.status = 'canceled';
    sub.canceled_at = sub.canceled_at ?? now;
    sub.ended_at = now;
    sub.cancel_at_period_end = false;
    sub.cancel_at = null;
    sub.cancellation_details = {
      comment: details.comment || sub.cancellation_details?.comment || null,
      feedback: (details.feedback || sub.cancellation_details?.feedback || null) as Stripe.Subscription.CancellationDetails.Feedback | null,
      feedback_option: null,
      reason: 'cancellation_requested',
    };
    this.emit(pending, 'customer.subscription.deleted', this.renderSubscription(sub), request);
  }

  /**
   * Moves a subscription to its next period (test control). A subscription set to cancel at period
   * end ends instead. `forceFail` makes the renewal payment fail regardless of the failure flags.
   */
  renew(subId: string, forceFail = false): { subscription: SubscriptionObject; invoice: InvoiceObject | null; emitted: Emitted } {
    const sub = this.subscriptionRecord(subId);
    this.requireLive(sub);
    const pending: EventRecord[] = [];
    const before = this.renderSubscription(sub);
    const now = nowSeconds();
    if (sub.cancel_at_period_end) {
      this.endSubscription(sub, now, {}, pending, NO_REQUEST);
      return { subscription: this.renderSubscription(sub), invoice: null, emitted: this.send(pending) };
    }
    for (const it of sub.items) {
      const r = this.price(it.price).recurring!;
      it.current_period_start = it.current_period_end;
      it.current_period_end = addInterval(it.current_period_start, r.interval, r.interval_count);
    }
    const invoice = this.createInvoice(sub, 'subscription_cycle', now, false);
    sub.latest_invoice = invoice.id;
    const fails = forceFail || this.consumeFailure(sub.customer);
    if (fails) {
      this.markFailed(invoice, now, false);
      sub.status = 'past_due';
      this.emit(pending, 'invoice.payment_failed', invoice, NO_REQUEST);
    } else {
      this.markPaid(invoice, now);
      sub.status = 'active';
      this.emit(pending, 'invoice.paid', invoice, NO_REQUEST);
    }
    const after = this.renderSubscription(sub);
    this.emit(pending, 'customer.subscription.updated', after, NO_REQUEST, changedFields(before, after));
    return { subscription: after, invoice, emitted: this.send(pending) };
  }

  private openInvoiceOf(sub: SubscriptionRecord): InvoiceObject | undefined {
    const latest = sub.latest_invoice ? this.store.invoices.get(sub.latest_invoice) : undefined;
    return latest?.status === 'open' ? latest : undefined;
  }

  /** Test control: a failed payment leaves the subscription past due (retrying an open invoice, or renewing). */
  makePastDue(subId: string): { subscription: SubscriptionObject; invoice: InvoiceObject | null; emitted: Emitted } {
    const sub = this.subscriptionRecord(subId);
    this.requireLive(sub);
    const open = this.openInvoiceOf(sub);
    if (!open) return this.renew(subId, true);
    const pending: EventRecord[] = [];
    const before = this.renderSubscription(sub);
    this.markFailed(open, nowSeconds(), false);
    sub.status = 'past_due';
    this.emit(pending, 'invoice.payment_failed', open, NO_REQUEST);
    const after = this.renderSubscription(sub);
    const changed = changedFields(before, after);
    if (Object.keys(changed).length > 0) this.emit(pending, 'customer.subscription.updated', after, NO_REQUEST, changed);
    return { subscription: after, invoice: open, emitted: this.send(pending) };
  }

  /** Test control: every retry has failed; the subscription becomes unpaid. */
  makeUnpaid(subId: string): { subscription: SubscriptionObject; invoice: InvoiceObject | null; emitted: Emitted } {
    const sub = this.subscriptionRecord(subId);
    this.requireLive(sub);
    const earlier: Emitted[] = [];
    if (sub.status !== 'past_due' || !this.openInvoiceOf(sub)) earlier.push(this.makePastDue(subId).emitted);
    const open = this.openInvoiceOf(sub)!;
    const pending: EventRecord[] = [];
    const before = this.renderSubscription(sub);
    this.markFailed(open, nowSeconds(), true);
    sub.status = 'unpaid';
    this.emit(pending, 'invoice.payment_failed', open, NO_REQUEST);
    const after = this.renderSubscription(sub);
    this.emit(pending, 'customer.subscription.updated', after, NO_REQUEST, changedFields(before, after));
    const last = this.send(pending);
    return {
      subscription: after,
      invoice: open,
      emitted: { events: [...earlier.flatMap((e) => e.events), ...last.events], delivered: Promise.all([...earlier.map((e) => e.delivered), last.delivered]).then(() => undefined) },
    };
  }

  /** The API's subscriptions.update: price changes (no proration), cancel at period end, metadata. */
  updateSubscription(subId: string, p: SubscriptionUpdate, request: RequestInfo = NO_REQUEST): { subscription: SubscriptionObject; emitted: Emitted } {
    const sub = this.subscriptionRecord(subId);
    const touchesBilling = p.items !== undefined || p.cancel_at_period_end !== undefined || p.default_payment_method !== undefined || p.description !== undefined;
    if (sub.status === 'canceled' && touchesBilling) {
      throw invalid('subscription', 'A canceled subscription can only update its cancellation_details and metadata.', 'subscription_canceled');
    }
    const before = this.renderSubscription(sub);
    const now = nowSeconds();
    if (p.items) {
      // Work on a copy so a refused change leaves the subscription as it was.
      const items = sub.items.map((it) => ({ ...it }));
      p.items.forEach((change, i) => {
        const param = `items[${i}]`;
        const existing = change.id ? items.find((it) => it.id === change.id) : undefined;
        if (change.id && !existing) throw invalid(`${param}[id]`, `Subscription item ${change.id} does not belong to ${sub.id}.`, 'resource_missing');
        if (change.deleted) {
          if (!existing) throw invalid(`${param}[id]`, 'Deleting an item needs its id.', 'parameter_missing');
          items.splice(items.indexOf(existing), 1);
          return;
        }
        const price = change.price ? this.price(change.price, `${param}[price]`) : undefined;
        if (price) {
          if (!price.active) throw invalid(`${param}[price]`, `The price \`${price.id}\` is not active.`, 'price_inactive');
          if (!price.recurring) throw invalid(`${param}[price]`, 'A subscription needs recurring prices.');
          if (price.currency !== sub.currency) throw invalid(`${param}[price]`, `The price is in ${price.currency}, the subscription in ${sub.currency}.`);
        }
        if (existing) {
          if (price) {
            const old = this.price(existing.price).recurring!;
            existing.price = price.id;
            // A new interval starts a new period now; the same interval keeps the billing cycle.
            if (old.interval !== price.recurring!.interval || old.interval_count !== price.recurring!.interval_count) {
              existing.current_period_start = now;
              existing.current_period_end = addInterval(now, price.recurring!.interval, price.recurring!.interval_count);
            }
          }
          if (change.quantity !== undefined) existing.quantity = change.quantity;
          existing.metadata = applyMetadata(existing.metadata, change.metadata);
        } else {
          if (!price) throw invalid(`${param}[price]`, 'A new item needs a price.', 'parameter_missing');
          const anchor = items[0];
          items.push({
            id: newId('si', 14),
            created: now,
            price: price.id,
            quantity: change.quantity ?? 1,
            current_period_start: anchor?.current_period_start ?? now,
            current_period_end: anchor?.current_period_end ?? addInterval(now, price.recurring!.interval, price.recurring!.interval_count),
            metadata: applyMetadata({}, change.metadata),
          });
        }
      });
      if (items.length === 0) throw invalid('items', 'A subscription needs at least one item; cancel it instead.');
      sub.items = items;
    }
    if (p.cancel_at_period_end !== undefined && p.cancel_at_period_end !== sub.cancel_at_period_end) {
      sub.cancel_at_period_end = p.cancel_at_period_end;
      sub.cancel_at = p.cancel_at_period_end ? (sub.items[0]?.current_period_end ?? null) : null;
      sub.canceled_at = p.cancel_at_period_end ? now : null;
      sub.cancellation_details = { comment: null, feedback: null, feedback_option: null, reason: p.cancel_at_period_end ? 'cancellation_requested' : null };
    }
    if (p.cancellation_details && sub.cancellation_details) {
      if (p.cancellation_details.comment !== undefined) sub.cancellation_details.comment = p.cancellation_details.comment || null;
      if (p.cancellation_details.feedback !== undefined) sub.cancellation_details.feedback = p.cancellation_details.feedback || null;
    }
    if (p.default_payment_method !== undefined) {
      if (!this.store.paymentMethods.has(p.default_payment_method)) throw noSuch('pm', p.default_payment_method, 'default_payment_method');
      sub.default_payment_method = p.default_payment_method;
    }
    if (p.description !== undefined) sub.description = p.description || null;
    sub.metadata = applyMetadata(sub.metadata, p.metadata);
    const after = this.renderSubscription(sub);
    const changed = changedFields(before, after);
    const pending: EventRecord[] = [];
    if (Object.keys(changed).length > 0) this.emit(pending, 'customer.subscription.updated', after, request, changed);
    return { subscription: after, emitted: this.send(pending) };
  }

  /** The API's subscriptions.cancel: ends it now. */
  cancelSubscription(subId: string, p: { cancellation_details?: { comment?: string; feedback?: string } }, request: RequestInfo = NO_REQUEST): { subscription: SubscriptionObject; emitted: Emitted } {
    const sub = this.subscriptionRecord(subId);
    this.requireLive(sub);
    const pending: EventRecord[] = [];
    this.endSubscription(sub, nowSeconds(), p.cancellation_details ?? {}, pending, request);
    return { subscription: this.renderSubscription(sub), emitted: this.send(pending) };
  }

  /**
   * Prices the portal offers as a switch: active recurring prices in the subscription's currency
   * whose product is in the same family (products with equal `metadata.family`; products without
   * one form a single family).
   */
  switchOptions(sub: SubscriptionRecord): PriceObject[] {
    const current = sub.items[0] ? this.price(sub.items[0].price) : undefined;
    if (!current) return [];
    const family = (productId: string) => this.store.products.get(productId)?.metadata.family ?? '';
    const currentFamily = family(current.product);
    return [...this.store.prices.values()].filter(
      (p) => p.id !== current.id && p.active && p.recurring && p.currency === sub.currency && this.store.products.get(p.product)?.active && family(p.product) === currentFamily,
    );
  }
}
