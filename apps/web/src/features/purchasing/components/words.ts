import type { PurchaseOrderStatus } from '@tappet/contracts';
import type { Status } from '@tappet/ui';
import { formatMoney } from '@tappet/domain';

/** Each order state in words, with the status shape that goes with it (never colour alone). */
export const orderStatusWords: Record<PurchaseOrderStatus, { label: string; status: Status }> = {
  draft: { label: 'Draft', status: 'na' },
  awaiting_approval: { label: 'Awaiting approval', status: 'advise' },
  approved: { label: 'Approved', status: 'ok' },
  sent: { label: 'Sent', status: 'advise' },
  partly_received: { label: 'Partly received', status: 'advise' },
  received: { label: 'Received', status: 'ok' },
  cancelled: { label: 'Cancelled', status: 'na' },
  closed: { label: 'Back-order closed', status: 'na' },
};

/** Money for people: "£1,234.56"; a dash when unknown. */
export function money(minor: number | null | undefined, currency: string | null | undefined): string {
  if (minor === null || minor === undefined || !currency) return '—';
  return formatMoney(minor, currency);
}

/** A decimal for the explanation panel: at most two places. */
export const two = (n: number) => (Math.round(n * 100) / 100).toLocaleString('en-GB', { maximumFractionDigits: 2 });
