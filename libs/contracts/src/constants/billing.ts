// Schema-free: screens import these words without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

/** Tappet's own billing states (mapped from Stripe's subscription status). */
export const billingStates = ['trial', 'active', 'past_due', 'suspended', 'cancelled'] as const;
export type BillingStateName = (typeof billingStates)[number];

/** Words shown for each state. */
export const billingStateLabels: Record<BillingStateName, string> = {
  trial: 'Trial',
  active: 'Active',
  past_due: 'Payment overdue',
  suspended: 'Suspended',
  cancelled: 'Cancelled',
};
