import { formatMoney } from '@tappet/domain';
import { A4Writer } from '../../lib/a4-document';

export interface EstimatePdfInput {
  reference: string;
  version: number;
  shopName: string;
  shopAddress: string;
  customerName: string | null;
  vehicle: string;
  jobTitle: string;
  currency: string;
  date: Date;
  note: string | null;
  lines: Array<{ description: string; quantity: string; kind: string; unitPriceMinor: number; taxRatePercent: number; netMinor: number }>;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  taxByRate: { ratePercent: number; netMinor: number; taxMinor: number }[];
  approvalUrl: string | null;
  linkExpiresAt: Date | null;
}

/**
 * An estimate as an A4 PDF (pdf-lib, built-in Helvetica): shop, customer, vehicle and job, one row
 * per line with quantity (hours for labour), unit price, tax rate and net, the tax per rate, the
 * total, and the approval link with its expiry.
 */
export async function renderEstimatePdf(input: EstimatePdfInput): Promise<Buffer> {
  const w = await A4Writer.create(`Estimate ${input.reference}`);
  const { margin, width, bold } = w;
  const money = (minor: number) => formatMoney(minor, input.currency);

  w.title(`Estimate ${input.reference}`, `Date: ${input.date.toISOString().slice(0, 10)}${input.version > 1 ? `   (revision ${input.version})` : ''}`);
  w.parties({ label: 'From', name: input.shopName, address: input.shopAddress }, { label: 'For', name: input.customerName ?? '' });
  w.down(22);
  w.text(w.fit(`Vehicle: ${input.vehicle}`, w.contentWidth), margin);
  w.down(14);
  w.text(w.fit(`Work: ${input.jobTitle}`, w.contentWidth), margin);
  w.down(26);
  const cols = { description: margin, qty: width - margin - 210, unit: width - margin - 130, tax: width - margin - 80, net: width - margin };
  const header = w.columnHeads([
    { label: 'Description', x: cols.description },
    { label: 'Qty / hours', x: cols.qty, align: 'right' },
    { label: 'Unit price', x: cols.unit, align: 'right' },
    { label: 'Tax', x: cols.tax, align: 'right' },
    { label: 'Net', x: cols.net, align: 'right' },
  ]);
  for (const l of input.lines) {
    w.breakBelow(margin + 120, header);
    w.text(w.fit(l.description, cols.qty - cols.description - 60), cols.description);
    w.right(l.kind === 'labour' ? `${l.quantity} h` : l.quantity, cols.qty);
    w.right(money(l.unitPriceMinor), cols.unit);
    w.right(`${l.taxRatePercent}%`, cols.tax);
    w.right(money(l.netMinor), cols.net);
    w.down(16);
  }
  w.rule(10);
  w.down(4);
  w.right(`Net ${money(input.netMinor)}`, cols.net);
  for (const r of input.taxByRate) {
    w.down(14);
    w.right(`Tax at ${r.ratePercent}% on ${money(r.netMinor)}: ${money(r.taxMinor)}`, cols.net);
  }
  w.down(18);
  w.right(`Total including tax ${money(input.grossMinor)}`, cols.net, 12, bold);
  if (input.note) {
    w.down(28);
    w.text(w.fit(`Note: ${input.note}`, w.contentWidth), margin);
  }
  if (input.approvalUrl) {
    w.down(30);
    w.text('To approve or decline this estimate, open:', margin, 10, bold);
    w.down(14);
    w.text(w.fit(input.approvalUrl, w.contentWidth, 8), margin, 8);
    if (input.linkExpiresAt) {
      w.down(13);
      w.text(`The link works once and until ${input.linkExpiresAt.toISOString().slice(0, 10)}.`, margin, 9);
    }
  }
  w.footer('An estimate, not an invoice. Work beyond the approved amount is only done after a new approval.');
  return w.save();
}
