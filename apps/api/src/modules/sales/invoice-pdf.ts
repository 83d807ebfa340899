import { formatMoney } from '@tappet/domain';
import { A4Writer } from '../../lib/a4-document';

/** What a printed invoice or credit note shows. Amounts in minor units of `currency`. */
export interface InvoicePdfInput {
  title: string;
  number: string | null;
  issuedOn: string | null;
  shopName: string;
  shopAddress: string;
  customerName: string;
  customerAddress: string | null;
  currency: string;
  reference: string | null;
  lines: Array<{ description: string; quantity: string; unitPriceMinor: number; discountPercent: number; taxRatePercent: number; netMinor: number }>;
  taxByRate: Array<{ ratePercent: number; netMinor: number; taxMinor: number }>;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  paidMinor: number;
  creditedMinor: number;
  dueMinor: number;
  payUrl: string | null;
  notes: string | null;
}

const percentText = (n: number) => `${Number(n.toFixed(3))}%`;

/**
 * Renders an invoice or credit note as an A4 PDF (pdf-lib, built-in Helvetica): shop and customer,
 * number and date, one row per line with its tax rate, the net, tax per rate and gross, and what is
 * paid and due, with the pay link when one exists.
 */
export async function renderInvoicePdf(input: InvoicePdfInput): Promise<Buffer> {
  const w = await A4Writer.create(`${input.title} ${input.number ?? '(draft)'}`);
  const { margin, width, font, bold } = w;
  const money = (minor: number) => formatMoney(minor, input.currency);

  w.title(`${input.title} ${input.number ?? '(draft, not issued)'}`, `Date: ${input.issuedOn ?? 'not issued'}`, input.reference);
  w.parties({ label: 'From', name: input.shopName, address: input.shopAddress }, { label: 'To', name: input.customerName, address: input.customerAddress });
  w.down(28);
  const cols = { description: margin, qty: width - margin - 230, unit: width - margin - 160, tax: width - margin - 90, total: width - margin };
  const header = w.columnHeads([
    { label: 'Description', x: cols.description },
    { label: 'Qty', x: cols.qty, align: 'right' },
    { label: 'Unit price', x: cols.unit, align: 'right' },
    { label: 'Tax', x: cols.tax, align: 'right' },
    { label: 'Net', x: cols.total, align: 'right' },
  ]);
  for (const l of input.lines) {
    w.breakBelow(margin + 140, header);
    const discount = l.discountPercent > 0 ? ` (less ${percentText(l.discountPercent)})` : '';
    w.text(w.fit(`${l.description}${discount}`, cols.qty - cols.description - 40), cols.description);
    w.right(l.quantity, cols.qty);
    w.right(money(l.unitPriceMinor), cols.unit);
    w.right(percentText(l.taxRatePercent), cols.tax);
    w.right(money(l.netMinor), cols.total);
    w.down(16);
  }
  w.down(-6);
  w.rule();
  w.down(16);
  const total = (label: string, minor: number, f = font, size = 10) => {
    w.right(label, cols.tax, size, f);
    w.right(money(minor), cols.total, size, f);
    w.down(15);
  };
  total('Net', input.netMinor);
  for (const r of input.taxByRate) total(`Tax at ${percentText(r.ratePercent)} on ${money(r.netMinor)}`, r.taxMinor);
  total('Total', input.grossMinor, bold, 12);
  if (input.creditedMinor > 0) total('Credited', -input.creditedMinor);
  if (input.paidMinor > 0) total('Paid', -input.paidMinor);
  if (input.title === 'Invoice') total('Due', input.dueMinor, bold, 11);
  if (input.notes) {
    w.down(14);
    w.text(w.fit(input.notes, w.contentWidth), margin);
  }
  if (input.payUrl && input.dueMinor > 0) {
    w.down(20);
    w.text('Pay by card:', margin, 9, bold);
    w.down(12);
    w.text(w.fit(input.payUrl, w.contentWidth, 8), margin, 8);
  }
  return w.save();
}
