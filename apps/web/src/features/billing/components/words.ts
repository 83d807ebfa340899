import { billingStateLabels, type BillingStateName } from '@tappet/contracts';
import type { Status } from '@tappet/ui';

/** Each billing state's pill: a status shape and Tappet's word for it. */
export const billingPill: Record<BillingStateName, { status: Status; label: string }> = {
  trial: { status: 'na', label: billingStateLabels.trial },
  active: { status: 'ok', label: billingStateLabels.active },
  past_due: { status: 'advise', label: billingStateLabels.past_due },
  suspended: { status: 'fail', label: billingStateLabels.suspended },
  cancelled: { status: 'fail', label: billingStateLabels.cancelled },
};

// Dates as every screen shows them (lib/dates.ts).
export { formatDate } from '../../../lib/dates';

/** A monthly price in minor units, e.g. "£49.00". */
export function formatPrice(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat(undefined, { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** "3 seats", "No limit". */
export function limitText(limit: number | null, one: string, many: string): string {
  if (limit === null) return 'No limit';
  return `${limit.toLocaleString()} ${limit === 1 ? one : many}`;
}
