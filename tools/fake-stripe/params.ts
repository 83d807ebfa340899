// Request parameters of every endpoint the fake serves, as strict zod schemas. The SDK sends
// form-encoded values, so numbers and booleans arrive as strings; an unknown parameter is refused
// (Stripe does the same) so that code relying on something the fake ignores fails loudly.
import { z } from 'zod';
import { fromZod } from './errors.ts';

const intParam = z.union([z.number().int(), z.string().regex(/^-?\d+$/, 'expected an integer').transform(Number)]);
const nonNegativeInt = intParam.pipe(z.number().int().min(0).max(99_999_999));
const boolParam = z.union([z.boolean(), z.enum(['true', 'false']).transform((v) => v === 'true')]);
const idParam = (prefix: string) => z.string().regex(new RegExp(`^${prefix}_[A-Za-z0-9]{1,64}$`), `expected an id starting with ${prefix}_`);
const text = (max: number) => z.string().max(max);
const currency = z
  .string()
  .regex(/^[A-Za-z]{3}$/, 'expected a three-letter ISO currency code')
  .transform((c) => c.toLowerCase());
const email = z.email().max(512);
const httpUrl = (placeholder?: string) =>
  z
    .string()
    .max(5000)
    .refine((s) => {
      try {
        const u = new URL(placeholder ? s.replaceAll(placeholder, 'x') : s);
        return u.protocol === 'http:' || u.protocol === 'https:';
      } catch {
        return false;
      }
    }, 'expected an absolute http(s) URL');

/** `''` clears all metadata; a key set to `''` is removed. */
export const metadataParam = z.union([z.literal(''), z.record(z.string().min(1).max(40), z.string().max(500))]);
export type MetadataParam = z.infer<typeof metadataParam>;

const expandParam = z
  .union([z.array(z.string().max(200)).max(20), z.string().max(200).transform((s) => [s])])
  .optional();
const listParams = {
  limit: intParam.pipe(z.number().int().min(1).max(100)).optional(),
  starting_after: z.string().max(200).optional(),
  ending_before: z.string().max(200).optional(),
  expand: expandParam,
};
const interval = z.enum(['day', 'week', 'month', 'year']);

export const expandOnly = z.strictObject({ expand: expandParam });

export const customerCreate = z.strictObject({
  email: z.union([email, z.literal('')]).optional(),
  name: text(256).optional(),
  phone: text(20).optional(),
  description: text(350).optional(),
  metadata: metadataParam.optional(),
  expand: expandParam,
});
export const customerUpdate = customerCreate.extend({
  invoice_settings: z.strictObject({ default_payment_method: z.union([idParam('pm'), z.literal('')]).optional() }).optional(),
});

export const productCreate = z.strictObject({
  id: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/).optional(),
  name: text(250).min(1),
  active: boolParam.optional(),
  description: text(40000).optional(),
  metadata: metadataParam.optional(),
  expand: expandParam,
});
export const productUpdate = z.strictObject({
  name: text(250).min(1).optional(),
  active: boolParam.optional(),
  description: text(40000).optional(),
  metadata: metadataParam.optional(),
  expand: expandParam,
});
export const productList = z.strictObject({ ...listParams, active: boolParam.optional() });

const recurringParam = z.strictObject({
  interval,
  interval_count: intParam.pipe(z.number().int().min(1).max(12)).optional(),
  trial_period_days: intParam.pipe(z.number().int().min(1).max(730)).optional(),
  usage_type: z.literal('licensed').optional(),
});

export const priceCreate = z
  .strictObject({
    currency,
    unit_amount: nonNegativeInt,
    product: idParam('prod').optional(),
    product_data: z.strictObject({ name: text(250).min(1), metadata: metadataParam.optional() }).optional(),
    recurring: recurringParam.optional(),
    lookup_key: text(200).min(1).optional(),
    transfer_lookup_key: boolParam.optional(),
    nickname: text(250).optional(),
    active: boolParam.optional(),
    metadata: metadataParam.optional(),
    billing_scheme: z.literal('per_unit').optional(),
    tax_behavior: z.enum(['exclusive', 'inclusive', 'unspecified']).optional(),
    expand: expandParam,
  })
  .refine((p) => (p.product === undefined) !== (p.product_data === undefined), {
    message: 'give exactly one of product and product_data',
    path: ['product'],
  });
export const priceUpdate = z.strictObject({
  active: boolParam.optional(),
  lookup_key: z.union([text(200).min(1), z.literal('')]).optional(),
  transfer_lookup_key: boolParam.optional(),
  nickname: text(250).optional(),
  metadata: metadataParam.optional(),
  expand: expandParam,
});
export const priceList = z.strictObject({
  ...listParams,
  active: boolParam.optional(),
  currency: currency.optional(),
  product: idParam('prod').optional(),
  type: z.enum(['one_time', 'recurring']).optional(),
  lookup_keys: z.array(text(200)).max(10).optional(),
});

const priceDataParam = z.strictObject({
  currency,
  unit_amount: nonNegativeInt,
  product: idParam('prod').optional(),
  product_data: z.strictObject({ name: text(250).min(1), description: text(40000).optional(), metadata: metadataParam.optional() }).optional(),
  recurring: z.strictObject({ interval, interval_count: intParam.pipe(z.number().int().min(1).max(12)).optional() }).optional(),
  tax_behavior: z.enum(['exclusive', 'inclusive', 'unspecified']).optional(),
});
export type PriceDataParam = z.infer<typeof priceDataParam>;

export const checkoutSessionCreate = z
  .strictObject({
    mode: z.enum(['subscription', 'payment']),
    line_items: z
      .array(
        z.strictObject({
          price: idParam('price').optional(),
          price_data: priceDataParam.optional(),
          quantity: intParam.pipe(z.number().int().min(1).max(999)).optional(),
        }),
      )
      .min(1)
      .max(20),
    success_url: httpUrl('{CHECKOUT_SESSION_ID}'),
    cancel_url: httpUrl().optional(),
    customer: idParam('cus').optional(),
    customer_email: email.optional(),
    client_reference_id: text(200).min(1).optional(),
    metadata: metadataParam.optional(),
    subscription_data: z
      .strictObject({
        trial_period_days: intParam.pipe(z.number().int().min(1).max(730)).optional(),
        trial_end: intParam.optional(),
        metadata: metadataParam.optional(),
        description: text(500).optional(),
      })
      .optional(),
    payment_intent_data: z.strictObject({ metadata: metadataParam.optional(), description: text(1000).optional() }).optional(),
    payment_method_types: z.array(z.literal('card')).optional(),
    allow_promotion_codes: boolParam.optional(),
    billing_address_collection: z.enum(['auto', 'required']).optional(),
    customer_creation: z.enum(['always', 'if_required']).optional(),
    payment_method_collection: z.enum(['always', 'if_required']).optional(),
    locale: text(10).optional(),
    expires_at: intParam.optional(),
    expand: expandParam,
  })
  .superRefine((p, ctx) => {
    if (p.customer && p.customer_email) ctx.addIssue({ code: 'custom', message: 'give customer or customer_email, not both', path: ['customer_email'] });
    p.line_items.forEach((li, i) => {
      if ((li.price === undefined) === (li.price_data === undefined)) {
        ctx.addIssue({ code: 'custom', message: 'give exactly one of price and price_data', path: ['line_items', i, 'price'] });
      }
      if (li.price_data && (li.price_data.product === undefined) === (li.price_data.product_data === undefined)) {
        ctx.addIssue({ code: 'custom', message: 'give exactly one of product and product_data', path: ['line_items', i, 'price_data', 'product'] });
      }
    });
    if (p.mode === 'payment' && p.subscription_data) ctx.addIssue({ code: 'custom', message: 'only for mode=subscription', path: ['subscription_data'] });
    if (p.mode === 'subscription' && p.payment_intent_data) ctx.addIssue({ code: 'custom', message: 'only for mode=payment', path: ['payment_intent_data'] });
  });
export type CheckoutSessionCreate = z.infer<typeof checkoutSessionCreate>;
export const checkoutSessionList = z.strictObject({
  ...listParams,
  customer: idParam('cus').optional(),
  subscription: idParam('sub').optional(),
  status: z.enum(['open', 'complete', 'expired']).optional(),
});
export const lineItemList = z.strictObject(listParams);

export const subscriptionList = z.strictObject({
  ...listParams,
  customer: idParam('cus').optional(),
  price: idParam('price').optional(),
  status: z.enum(['active', 'all', 'canceled', 'ended', 'incomplete', 'incomplete_expired', 'past_due', 'paused', 'trialing', 'unpaid']).optional(),
});
const cancellationDetails = z
  .strictObject({
    comment: z.union([text(5000), z.literal('')]).optional(),
    feedback: z
      .union([z.enum(['customer_service', 'low_quality', 'missing_features', 'other', 'switched_service', 'too_complex', 'too_expensive', 'unused']), z.literal('')])
      .optional(),
  })
  .optional();
export const subscriptionUpdate = z.strictObject({
  items: z
    .array(
      z.strictObject({
        id: z.string().regex(/^si_[A-Za-z0-9]{1,64}$/).optional(),
        price: idParam('price').optional(),
        quantity: intParam.pipe(z.number().int().min(1).max(999)).optional(),
        deleted: boolParam.optional(),
        metadata: metadataParam.optional(),
      }),
    )
    .max(20)
    .optional(),
  cancel_at_period_end: boolParam.optional(),
  metadata: metadataParam.optional(),
  description: z.union([text(500), z.literal('')]).optional(),
  default_payment_method: idParam('pm').optional(),
  proration_behavior: z.enum(['always_invoice', 'create_prorations', 'none']).optional(),
  payment_behavior: z.enum(['allow_incomplete', 'default_incomplete', 'error_if_incomplete', 'pending_if_incomplete']).optional(),
  cancellation_details: cancellationDetails,
  expand: expandParam,
});
export type SubscriptionUpdate = z.infer<typeof subscriptionUpdate>;
export const subscriptionCancel = z.strictObject({
  invoice_now: boolParam.optional(),
  prorate: boolParam.optional(),
  cancellation_details: cancellationDetails,
  expand: expandParam,
});

export const portalSessionCreate = z.strictObject({
  customer: idParam('cus'),
  return_url: httpUrl().optional(),
  configuration: z.string().regex(/^bpc_[A-Za-z0-9]{1,64}$/).optional(),
  locale: text(10).optional(),
  expand: expandParam,
});

export const invoiceList = z.strictObject({
  ...listParams,
  customer: idParam('cus').optional(),
  subscription: idParam('sub').optional(),
  status: z.enum(['draft', 'open', 'paid', 'uncollectible', 'void']).optional(),
  collection_method: z.enum(['charge_automatically', 'send_invoice']).optional(),
});
export const invoicePay = z.strictObject({ expand: expandParam, payment_method: idParam('pm').optional() });

// Test controls take JSON.
export const failNextPayment = z.strictObject({
  customer: idParam('cus').optional(),
  count: z.number().int().min(1).max(20).optional(),
});
export const advance = z.strictObject({ to: z.enum(['renewal', 'past_due', 'unpaid']) });

/** Parses with a schema, throwing the Stripe-shaped 400 on failure. */
export function parse<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input ?? {});
  if (!result.success) throw fromZod(result.error);
  return result.data;
}
