// The fake's in-memory state. Object shapes are subsets of the `stripe` package's own types
// (Pick<Stripe.X, …>), so a field we return has the type the SDK declares for it. Fields the SDK
// types as Decimal travel as strings on the wire (the SDK converts them), and ids of related
// objects are kept as strings here and swapped for objects only when a caller asks to expand them.
import { randomBytes } from 'node:crypto';
import type Stripe from 'stripe';

export type Metadata = Record<string, string>;

/** A Stripe list envelope. */
export interface WireList<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

export type CustomerObject = Pick<
  Stripe.Customer,
  | 'id'
  | 'object'
  | 'address'
  | 'balance'
  | 'created'
  | 'currency'
  | 'default_source'
  | 'delinquent'
  | 'description'
  | 'email'
  | 'invoice_prefix'
  | 'invoice_settings'
  | 'livemode'
  | 'metadata'
  | 'name'
  | 'phone'
  | 'preferred_locales'
  | 'shipping'
  | 'tax_exempt'
  | 'test_clock'
> & { invoice_settings: Stripe.Customer.InvoiceSettings & { default_payment_method: string | null } };

export type ProductObject = Pick<
  Stripe.Product,
  | 'id'
  | 'object'
  | 'active'
  | 'created'
  | 'description'
  | 'images'
  | 'livemode'
  | 'marketing_features'
  | 'metadata'
  | 'name'
  | 'package_dimensions'
  | 'shippable'
  | 'statement_descriptor'
  | 'tax_code'
  | 'type'
  | 'unit_label'
  | 'updated'
  | 'url'
> & { default_price: string | null };

export type PriceObject = Pick<
  Stripe.Price,
  | 'id'
  | 'object'
  | 'active'
  | 'billing_scheme'
  | 'created'
  | 'currency'
  | 'custom_unit_amount'
  | 'livemode'
  | 'lookup_key'
  | 'metadata'
  | 'nickname'
  | 'recurring'
  | 'tax_behavior'
  | 'tiers_mode'
  | 'transform_quantity'
  | 'type'
  | 'unit_amount'
> & { product: string; unit_amount_decimal: string | null };

export type PlanObject = Pick<
  Stripe.Plan,
  | 'id'
  | 'object'
  | 'active'
  | 'amount'
  | 'billing_scheme'
  | 'created'
  | 'currency'
  | 'interval'
  | 'interval_count'
  | 'livemode'
  | 'metadata'
  | 'meter'
  | 'nickname'
  | 'tiers_mode'
  | 'transform_usage'
  | 'trial_period_days'
  | 'usage_type'
> & { product: string; amount_decimal: string | null };

export type SubscriptionItemObject = Pick<
  Stripe.SubscriptionItem,
  | 'id'
  | 'object'
  | 'billing_thresholds'
  | 'created'
  | 'current_period_end'
  | 'current_period_start'
  | 'current_trial'
  | 'discounts'
  | 'metadata'
  | 'quantity'
  | 'subscription'
  | 'tax_rates'
> & { price: PriceObject; plan: PlanObject };

type SubscriptionFields = Pick<
  Stripe.Subscription,
  | 'id'
  | 'object'
  | 'application'
  | 'application_fee_percent'
  | 'automatic_tax'
  | 'billing_cycle_anchor'
  | 'billing_cycle_anchor_config'
  | 'billing_mode'
  | 'billing_thresholds'
  | 'cancel_at'
  | 'cancel_at_period_end'
  | 'canceled_at'
  | 'cancellation_details'
  | 'collection_method'
  | 'created'
  | 'currency'
  | 'customer_account'
  | 'days_until_due'
  | 'default_source'
  | 'description'
  | 'discounts'
  | 'ended_at'
  | 'invoice_settings'
  | 'livemode'
  | 'metadata'
  | 'next_pending_invoice_item_invoice'
  | 'on_behalf_of'
  | 'pause_collection'
  | 'pending_invoice_item_interval'
  | 'pending_setup_intent'
  | 'pending_update'
  | 'schedule'
  | 'start_date'
  | 'status'
  | 'test_clock'
  | 'transfer_data'
  | 'trial_end'
  | 'trial_settings'
  | 'trial_start'
> & { customer: string; latest_invoice: string | null; default_payment_method: string | null };

/** A subscription item as stored: the price by id, rendered with the current price object. */
export interface SubscriptionItemRecord {
  id: string;
  created: number;
  price: string;
  quantity: number;
  current_period_start: number;
  current_period_end: number;
  metadata: Metadata;
}

export type SubscriptionRecord = SubscriptionFields & { items: SubscriptionItemRecord[] };
export type SubscriptionObject = SubscriptionFields & { items: WireList<SubscriptionItemObject> };

export type InvoiceLineObject = Pick<
  Stripe.InvoiceLineItem,
  | 'id'
  | 'object'
  | 'amount'
  | 'currency'
  | 'description'
  | 'discount_amounts'
  | 'discountable'
  | 'discounts'
  | 'invoice'
  | 'livemode'
  | 'metadata'
  | 'parent'
  | 'period'
  | 'pretax_credit_amounts'
  | 'quantity'
  | 'subtotal'
  | 'taxes'
> & {
  subscription: string | null;
  pricing: { type: 'price_details'; price_details: { price: string; product: string }; unit_amount_decimal: string | null };
};

export type InvoiceObject = Pick<
  Stripe.Invoice,
  | 'id'
  | 'object'
  | 'account_country'
  | 'account_name'
  | 'amount_due'
  | 'amount_overpaid'
  | 'amount_paid'
  | 'amount_remaining'
  | 'amount_shipping'
  | 'attempt_count'
  | 'attempted'
  | 'auto_advance'
  | 'billing_reason'
  | 'collection_method'
  | 'created'
  | 'currency'
  | 'customer_email'
  | 'customer_name'
  | 'description'
  | 'discounts'
  | 'due_date'
  | 'effective_at'
  | 'ending_balance'
  | 'hosted_invoice_url'
  | 'invoice_pdf'
  | 'livemode'
  | 'metadata'
  | 'next_payment_attempt'
  | 'number'
  | 'period_end'
  | 'period_start'
  | 'starting_balance'
  | 'status'
  | 'status_transitions'
  | 'subtotal'
  | 'subtotal_excluding_tax'
  | 'test_clock'
  | 'total'
  | 'total_excluding_tax'
  | 'webhooks_delivered_at'
> & {
  customer: string;
  default_payment_method: string | null;
  lines: WireList<InvoiceLineObject>;
  parent: {
    type: 'subscription_details';
    quote_details: null;
    subscription_details: { metadata: Metadata | null; subscription: string };
  } | null;
};

export type CheckoutSessionObject = Pick<
  Stripe.Checkout.Session,
  | 'id'
  | 'object'
  | 'allow_promotion_codes'
  | 'amount_subtotal'
  | 'amount_total'
  | 'billing_address_collection'
  | 'cancel_url'
  | 'client_reference_id'
  | 'created'
  | 'currency'
  | 'customer_creation'
  | 'customer_details'
  | 'customer_email'
  | 'expires_at'
  | 'livemode'
  | 'locale'
  | 'metadata'
  | 'mode'
  | 'payment_method_collection'
  | 'payment_method_types'
  | 'payment_status'
  | 'status'
  | 'success_url'
  | 'total_details'
  | 'ui_mode'
  | 'url'
> & { customer: string | null; subscription: string | null; invoice: string | null; payment_intent: string | null };

/** One line of a checkout session, as requested. */
export interface CheckoutLine {
  id: string;
  price: string;
  quantity: number;
}

export interface CheckoutSessionRecord {
  session: CheckoutSessionObject;
  lines: CheckoutLine[];
  /** Echoed by the hosted page's forms so that another site cannot post to them blind. */
  formToken: string;
  subscriptionData: { trialPeriodDays: number | null; trialEnd: number | null; metadata: Metadata; description: string | null };
  paymentIntentData: { metadata: Metadata; description: string | null };
}

export type CheckoutLineItemObject = Pick<
  Stripe.LineItem,
  'id' | 'object' | 'adjustable_quantity' | 'amount_discount' | 'amount_subtotal' | 'amount_tax' | 'amount_total' | 'currency' | 'description' | 'metadata' | 'quantity'
> & { price: PriceObject };

export type PortalSessionObject = Pick<
  Stripe.BillingPortal.Session,
  'id' | 'object' | 'created' | 'customer' | 'customer_account' | 'flow' | 'livemode' | 'locale' | 'on_behalf_of' | 'return_url' | 'url'
> & { configuration: string };

export interface PortalSessionRecord {
  session: PortalSessionObject;
  formToken: string;
}

export type PaymentIntentObject = Pick<
  Stripe.PaymentIntent,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_capturable'
  | 'amount_received'
  | 'canceled_at'
  | 'cancellation_reason'
  | 'capture_method'
  | 'client_secret'
  | 'confirmation_method'
  | 'created'
  | 'currency'
  | 'description'
  | 'last_payment_error'
  | 'livemode'
  | 'metadata'
  | 'next_action'
  | 'payment_method_types'
  | 'receipt_email'
  | 'status'
> & { customer: string | null; payment_method: string | null; latest_charge: string | null };

export type PaymentMethodObject = Pick<Stripe.PaymentMethod, 'id' | 'object' | 'billing_details' | 'created' | 'livemode' | 'metadata' | 'type'> & {
  customer: string | null;
  card: { brand: string; display_brand: string; last4: string; exp_month: number; exp_year: number; funding: string; country: string | null };
};

export const EVENT_TYPES = [
  'checkout.session.completed',
  'customer.subscription.created',
  'customer.subscription.updated',
  'customer.subscription.deleted',
  'invoice.paid',
  'invoice.payment_failed',
] as const;
export type EventType = (typeof EVENT_TYPES)[number];

export interface EventObject {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: unknown; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: EventType;
}

export interface DeliveryAttempt {
  at: number;
  /** HTTP status of the receiver's answer, or null when the request failed outright. */
  status: number | null;
  error: string | null;
}

export interface EventRecord {
  event: EventObject;
  delivery: {
    status: 'pending' | 'delivered' | 'failed' | 'disabled';
    attempts: DeliveryAttempt[];
    nextAttemptAt: number | null;
  };
}

export interface IdempotentResult {
  fingerprint: string;
  status: number;
  body: unknown;
  /** Set while the first request with this key is still running. */
  inFlight: boolean;
}

const BASE62 = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** A Stripe-style id (`cus_…`, `sub_…`) with 24 random base62 characters. */
export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length * 2);
  let out = '';
  // Rejection sampling keeps the characters uniform (248 = 4 × 62).
  for (const b of bytes) {
    if (b < 248) out += BASE62[b % 62];
    if (out.length === length) break;
  }
  while (out.length < length) out += BASE62[randomBytes(1)[0]! % 62];
  return `${prefix}_${out}`;
}

/** Unix seconds. */
export function nowSeconds(): number {
  return Math.floor(Date.now() / 1000);
}

/** Everything the fake remembers. Exposed by startFakeStripe so tests can look inside. */
export class FakeStripeStore {
  readonly customers = new Map<string, CustomerObject>();
  readonly products = new Map<string, ProductObject>();
  readonly prices = new Map<string, PriceObject>();
  readonly subscriptions = new Map<string, SubscriptionRecord>();
  readonly invoices = new Map<string, InvoiceObject>();
  readonly checkoutSessions = new Map<string, CheckoutSessionRecord>();
  readonly portalSessions = new Map<string, PortalSessionRecord>();
  readonly paymentIntents = new Map<string, PaymentIntentObject>();
  readonly paymentMethods = new Map<string, PaymentMethodObject>();
  readonly events: EventRecord[] = [];
  readonly idempotency = new Map<string, IdempotentResult>();
  /** Pending forced payment failures: a global count and counts per customer id. */
  readonly failures = { global: 0, customers: new Map<string, number>() };
  invoiceSequence = 0;

  /** Forgets everything. */
  clear(): void {
    for (const m of [
      this.customers,
      this.products,
      this.prices,
      this.subscriptions,
      this.invoices,
      this.checkoutSessions,
      this.portalSessions,
      this.paymentIntents,
      this.paymentMethods,
      this.idempotency,
      this.failures.customers,
    ]) {
      m.clear();
    }
    this.events.length = 0;
    this.failures.global = 0;
    this.invoiceSequence = 0;
  }

  /** Looks any stored object up by its id, using the id's prefix. */
  findById(id: string): { kind: string; value: unknown } | undefined {
    const prefix = id.slice(0, id.indexOf('_'));
    const table: Record<string, Map<string, unknown>> = {
      cus: this.customers,
      prod: this.products,
      price: this.prices,
      sub: this.subscriptions,
      in: this.invoices,
      pi: this.paymentIntents,
      pm: this.paymentMethods,
    };
    const value = table[prefix]?.get(id);
    return value === undefined ? undefined : { kind: prefix, value };
  }
}
