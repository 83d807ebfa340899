import type { Invoice, InvoiceSummary } from '@tappet/contracts';
import { formatMoney, parseMinorUnits } from '@tappet/domain';
import type { Status } from '@tappet/ui';

/** Money for people: "£1,234.56"; a dash when unknown. */
export function money(minor: number | null | undefined, currency: string | null | undefined): string {
  if (minor === null || minor === undefined || !currency) return '—';
  return formatMoney(minor, currency);
}

/** "12.50" typed by a person → 1250 minor units, or null when it is not an amount. */
export function minorFrom(text: string): number | null {
  try {
    const minor = parseMinorUnits(text.trim().replace(/^[£$€]/, '').replace(/,/g, ''));
    return Number.isSafeInteger(minor) && minor >= 0 ? minor : null;
  } catch {
    return null;
  }
}

export const paymentWords: Record<InvoiceSummary['paymentStatus'], { label: string; status: Status }> = {
  unpaid: { label: 'Unpaid', status: 'fail' },
  part_paid: { label: 'Part paid', status: 'advise' },
  paid: { label: 'Paid', status: 'ok' },
};

export const methodWords: Record<Invoice['payments'][number]['method'], string> = { cash: 'Cash', bank_transfer: 'Bank transfer', card: 'Card' };

export const sourceWords: Record<InvoiceSummary['source'], string> = { job: 'Job', counter: 'Counter sale', vehicle: 'Vehicle sale', manual: 'Typed in', credit: 'Credit' };

/** The document's name: "Invoice INV-00012", "Credit note CN-00003", "Draft invoice". */
export function documentTitle(doc: Pick<InvoiceSummary, 'kind' | 'number'>): string {
  if (doc.kind === 'credit_note') return `Credit note ${doc.number ?? ''}`.trim();
  return doc.number ? `Invoice ${doc.number}` : 'Draft invoice';
}

export const percent = (n: number) => `${Number(n.toFixed(3))}\u00a0%`;
