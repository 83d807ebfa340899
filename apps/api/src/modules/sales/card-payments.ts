import { randomUUID } from 'node:crypto';
import type Stripe from 'stripe';
import type { EntityManager } from 'typeorm';
import { recordAudit } from '../audit/audit.service';
import { CardSessionEntity, InvoiceEntity, PaymentEntity } from './sales.entity';

// Card payments of invoices, confirmed ONLY by Stripe's signed webhook. The billing module's
// webhook router verifies the signature and deduplicates by event id; for a completed Checkout
// session whose metadata marks it as an invoice payment it hands the session here, inside its
// write. Nothing here trusts the browser's return to the success page.

/** Marks the Checkout sessions the sales module creates; the billing webhook hands those here. */
export const salesPaymentPurpose = 'tappet_invoice_payment';

/** The Checkout session of an invoice payment in this event, or null when the event is not ours. */
export function salesCheckoutOf(event: Stripe.Event): Stripe.Checkout.Session | null {
  if (event.type !== 'checkout.session.completed' && event.type !== 'checkout.session.async_payment_succeeded') return null;
  const session = event.data.object as Stripe.Checkout.Session;
  if (session.mode !== 'payment' || session.metadata?.['purpose'] !== salesPaymentPurpose) return null;
  return session;
}

/**
 * Records the payment of a completed session (once: the session id is unique on payments).
 * Returns the shop id, or null when the session names no invoice of ours or is not paid.
 */
export async function recordCardPayment(manager: EntityManager, session: Stripe.Checkout.Session, now: Date): Promise<string | null> {
  const shopId = session.metadata?.['shopId'];
  const invoiceId = session.metadata?.['invoiceId'];
  if (!shopId || !invoiceId || session.payment_status !== 'paid') return null;
  const invoice = await manager.getRepository(InvoiceEntity).findOne({ where: { id: invoiceId, shopId } });
  if (!invoice) return null;
  if (await manager.getRepository(PaymentEntity).exists({ where: { stripeSessionId: session.id } })) return shopId;
  const amount = session.amount_total ?? 0;
  if (amount <= 0) return shopId;
  await manager.insert(PaymentEntity, {
    id: randomUUID(),
    shopId,
    invoiceId,
    method: 'card',
    amountMinor: amount,
    receivedOn: now.toISOString().slice(0, 10),
    reference: typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? session.id),
    stripeSessionId: session.id,
    recordedByUserId: null,
    createdAt: now,
  });
  await manager.update(CardSessionEntity, { id: session.id, shopId }, { status: 'paid', completedAt: now });
  await recordAudit(manager, { shopId, actor: { userId: null }, action: 'sales.card_payment_received', entity: 'invoice', entityId: invoiceId, changes: { amountMinor: { before: null, after: amount }, session: { before: null, after: session.id } }, at: now });
  return shopId;
}
