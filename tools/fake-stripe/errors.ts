// Errors in the shape the SDK turns into its own error classes:
// `{ error: { type, message, code, param? } }` with a 4xx status.
import { type ZodError } from 'zod';

export type StripeErrorType = 'invalid_request_error' | 'idempotency_error' | 'card_error' | 'api_error';

/** An error the API answers with, as Stripe would. */
export class FakeStripeError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly param?: string,
    readonly type: StripeErrorType = 'invalid_request_error',
  ) {
    super(message);
  }

  toJSON(): { error: { type: StripeErrorType; message: string; code: string; param?: string } } {
    return { error: { type: this.type, message: this.message, code: this.code, ...(this.param ? { param: this.param } : {}) } };
  }
}

const KIND_NAMES: Record<string, string> = {
  cus: 'customer',
  prod: 'product',
  price: 'price',
  sub: 'subscription',
  in: 'invoice',
  pi: 'payment_intent',
  pm: 'payment_method',
  cs: 'checkout.session',
  bps: 'billing_portal.session',
  evt: 'event',
};

/** 404 `resource_missing`, worded like Stripe's. */
export function noSuch(kind: keyof typeof KIND_NAMES, id: string, param = 'id'): FakeStripeError {
  return new FakeStripeError(404, 'resource_missing', `No such ${KIND_NAMES[kind] ?? kind}: '${id}'`, param);
}

/** 400 with a message about one parameter. */
export function invalid(param: string, message: string, code = 'parameter_invalid'): FakeStripeError {
  return new FakeStripeError(400, code, message, param);
}

/** `line_items.0.price` → `line_items[0][price]`, the way the SDK spelled it. */
export function formParam(path: readonly PropertyKey[]): string {
  const [head, ...rest] = path.map(String);
  return `${head ?? ''}${rest.map((p) => `[${p}]`).join('')}`;
}

/** Turns the first zod issue into the error Stripe would give for it. */
export function fromZod(error: ZodError): FakeStripeError {
  const issue = error.issues[0];
  if (!issue) return invalid('', 'Invalid request.');
  if (issue.code === 'unrecognized_keys') {
    const param = formParam([...issue.path, issue.keys[0] ?? '']);
    return invalid(param, `Received unknown parameter: ${param}. (The local fake does not support it.)`, 'parameter_unknown');
  }
  const param = formParam(issue.path);
  if (issue.code === 'invalid_type' && issue.input === undefined) {
    return invalid(param, `Missing required param: ${param}.`, 'parameter_missing');
  }
  return invalid(param, `Invalid ${param}: ${issue.message}`);
}
