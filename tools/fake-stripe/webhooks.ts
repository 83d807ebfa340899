// Webhook delivery: signed with the SDK's own test-header helper, so the app verifies exactly what
// Stripe would send. First attempts go out one at a time in creation order; a failed attempt is
// retried after each of `retryDelaysMs` and then given up (never forever).
import Stripe from 'stripe';
import type { EventRecord } from './store.ts';

export interface WebhookDispatcherOptions {
  url: string | null;
  secret: string;
  retryDelaysMs: readonly number[];
  /** How long one delivery may take before it counts as failed. */
  timeoutMs: number;
}

/** Sends events to the webhook URL and records every attempt on the event's record. */
export class WebhookDispatcher {
  // A Stripe instance is only needed for its `webhooks` helpers; it never talks to the network.
  private readonly signer = new Stripe('sk_test_fake_stripe_signer_only');
  private readonly timers = new Set<NodeJS.Timeout>();
  private chain: Promise<void> = Promise.resolve();
  private closed = false;

  constructor(private readonly options: WebhookDispatcherOptions) {}

  /** Queues the first delivery; the promise settles when that attempt has finished. */
  enqueue(record: EventRecord): Promise<void> {
    if (!this.options.url) {
      record.delivery.status = 'disabled';
      return Promise.resolve();
    }
    const attempt = this.chain.then(() => this.attempt(record, 0));
    this.chain = attempt;
    return attempt;
  }

  /** Delivers an event again, with a fresh round of retries. */
  resend(record: EventRecord): Promise<void> {
    record.delivery.status = 'pending';
    return this.enqueue(record);
  }

  /** Cancels pending retries; later enqueues are recorded but not sent. */
  close(): void {
    this.closed = true;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
  }

  /** Cancels pending retries but keeps delivering (used by reset). */
  cancelRetries(): void {
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
  }

  private async attempt(record: EventRecord, retryIndex: number): Promise<void> {
    const url = this.options.url;
    if (this.closed || !url) return;
    const payload = JSON.stringify(record.event, null, 2);
    const header = this.signer.webhooks.generateTestHeaderString({ payload, secret: this.options.secret });
    let status: number | null = null;
    let error: string | null = null;
    try {
      const res = await fetch(url, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': header, 'User-Agent': 'TappetFakeStripe/1.0 (+local test stand-in)' },
        body: payload,
        signal: AbortSignal.timeout(this.options.timeoutMs),
        redirect: 'manual',
      });
      status = res.status;
      // Drain the body so the connection can be reused.
      await res.arrayBuffer().catch(() => undefined);
      if (!res.ok) error = `HTTP ${res.status}`;
    } catch (e) {
      error = e instanceof Error ? e.message : String(e);
    }
    record.delivery.attempts.push({ at: Date.now(), status, error });
    if (error === null) {
      record.delivery.status = 'delivered';
      record.delivery.nextAttemptAt = null;
      return;
    }
    const delay = this.options.retryDelaysMs[retryIndex];
    if (delay === undefined || this.closed) {
      record.delivery.status = 'failed';
      record.delivery.nextAttemptAt = null;
      return;
    }
    record.delivery.status = 'pending';
    record.delivery.nextAttemptAt = Date.now() + delay;
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      void this.attempt(record, retryIndex + 1);
    }, delay);
    timer.unref();
    this.timers.add(timer);
  }
}
