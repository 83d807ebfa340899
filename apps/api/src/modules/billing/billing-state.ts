import type { BillingStatus } from '@tappet/contracts';
import type { BillingState } from '../shops/shops.entity';
import type { ShopBilling } from './billing.entity';

const day = 24 * 60 * 60_000;

/** A new shop's free trial, which needs no card. */
export const trialDays = 14;
/** How long a shop may stay past due before it becomes read-only. */
export const graceDays = 14;

/** The billing record of a shop that has none yet: a trial counted from its creation. */
export function defaultBilling(shopId: string, createdAt: Date): ShopBilling {
  return {
    shopId,
    planId: null,
    trialEndsAt: new Date(createdAt.getTime() + trialDays * day),
    stripeCustomerId: null,
    stripeSubscriptionId: null,
    stripeStatus: null,
    currentPeriodEnd: null,
    cancelAtPeriodEnd: false,
    pastDueSince: null,
    manualSuspensionReason: null,
    manualSuspendedAt: null,
    updatedAt: createdAt,
  };
}

/** Since when the shop has been past due, or null when it is not. */
export function pastDueSinceOf(b: ShopBilling, now: Date): Date | null {
  if (b.stripeStatus === 'past_due' || b.stripeStatus === 'paused') return b.pastDueSince ?? now;
  if (hasNoLiveSubscription(b) && now.getTime() >= b.trialEndsAt.getTime()) return b.trialEndsAt;
  return null;
}

/** Stripe statuses that mean no subscription is paying or trialling (checkout never finished). */
function hasNoLiveSubscription(b: ShopBilling): boolean {
  return b.stripeStatus === null || b.stripeStatus === 'incomplete' || b.stripeStatus === 'incomplete_expired';
}

/**
 * Tappet's billing state from the shop's billing record at `now`:
 * a hand suspension wins; Stripe `active` → active, `trialing` → trial, `past_due` → past_due
 * (suspended once unpaid for {@link graceDays}), `unpaid` → suspended, `canceled` → cancelled;
 * without a live subscription the trial runs {@link trialDays} days and then counts as past due.
 */
export function deriveBillingState(b: ShopBilling, now: Date): BillingState {
  if (b.manualSuspensionReason) return 'suspended';
  switch (b.stripeStatus) {
    case 'active':
      return 'active';
    case 'trialing':
      return 'trial';
    case 'unpaid':
      return 'suspended';
    case 'canceled':
      return 'cancelled';
    default: {
      const since = pastDueSinceOf(b, now);
      if (since === null) return 'trial';
      return now.getTime() >= since.getTime() + graceDays * day ? 'suspended' : 'past_due';
    }
  }
}

/** The sentence a refused write answers with, naming why the shop is read-only; null if it is not. */
export function readOnlyReasonOf(state: BillingState, b: ShopBilling): string | null {
  if (state === 'suspended') {
    if (b.manualSuspensionReason) return `This shop is read-only: Tappet suspended it (${b.manualSuspensionReason}). Nothing has been deleted; contact Tappet support to reactivate it.`;
    if (b.stripeStatus === 'unpaid') return 'This shop is read-only: its subscription is suspended because invoices stayed unpaid. Nothing has been deleted; the owner can pay in Billing to restore writing at once.';
    return `This shop is read-only: its subscription is suspended because payment is more than ${graceDays} days overdue. Nothing has been deleted; the owner can pay in Billing to restore writing at once.`;
  }
  if (state === 'cancelled') return 'This shop is read-only: its subscription was cancelled. Nothing has been deleted; the owner can subscribe again in Billing to restore writing at once.';
  return null;
}

/** The state, trial and grace dates as every member of the shop may see them. */
export function billingStatusOf(state: BillingState, b: ShopBilling, now: Date): BillingStatus {
  const inTrial = state === 'trial';
  const trialEnd = b.stripeStatus === 'trialing' && b.currentPeriodEnd ? b.currentPeriodEnd : b.trialEndsAt;
  const since = state === 'past_due' || state === 'suspended' ? pastDueSinceOf(b, now) : null;
  const reason = readOnlyReasonOf(state, b);
  return {
    state,
    readOnly: reason !== null,
    readOnlyReason: reason,
    trialEndsAt: inTrial ? trialEnd.toISOString() : null,
    trialDaysLeft: inTrial ? Math.max(0, Math.ceil((trialEnd.getTime() - now.getTime()) / day)) : null,
    pastDueSince: since ? since.toISOString() : null,
    suspendsAt: state === 'past_due' && since ? new Date(since.getTime() + graceDays * day).toISOString() : null,
    canOpenPortal: b.stripeCustomerId !== null,
    suspendedByHand: b.manualSuspensionReason !== null,
  };
}
