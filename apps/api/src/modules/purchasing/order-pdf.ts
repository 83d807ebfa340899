import { formatMoney } from '@tappet/domain';
import { A4Writer } from '../../lib/a4-document';

/** What the printed order shows. Amounts are in the order's currency. */
export interface OrderPdfInput {
  reference: string;
  shopName: string;
  shopAddress: string;
  supplierName: string;
  currency: string;
  date: Date;
  note: string | null;
  lines: Array<{ partNumber: string; supplierNumber: string | null; description: string; quantity: number; unitPriceMinor: number; coreDepositMinor: number }>;
  totalMinor: number;
}

/**
 * Renders a purchase order as a one-or-more page A4 PDF (pdf-lib, built-in Helvetica): shop and
 * supplier, reference and date, one row per line with the supplier's number, and the total.
 */
export async function renderOrderPdf(input: OrderPdfInput): Promise<Buffer> {
  const w = await A4Writer.create(`Purchase order ${input.reference}`);
  const { margin, width, bold } = w;
  const money = (minor: number) => formatMoney(minor, input.currency);

  w.title(`Purchase order ${input.reference}`, `Date: ${input.date.toISOString().slice(0, 10)}`);
  w.parties({ label: 'From', name: input.shopName, address: input.shopAddress }, { label: 'To', name: input.supplierName });
  w.down(28);
  const cols = { number: margin, supplier: margin + 95, description: margin + 190, qty: width - margin - 170, unit: width - margin - 90, total: width - margin };
  const header = w.columnHeads([
    { label: 'Our number', x: cols.number },
    { label: 'Your number', x: cols.supplier },
    { label: 'Description', x: cols.description },
    { label: 'Qty', x: cols.qty, align: 'right' },
    { label: 'Unit price', x: cols.unit, align: 'right' },
    { label: 'Line total', x: cols.total, align: 'right' },
  ]);
  for (const l of input.lines) {
    w.breakBelow(margin + 60, header);
    w.text(w.fit(l.partNumber, 90), cols.number);
    w.text(w.fit(l.supplierNumber ?? '', 90), cols.supplier);
    w.text(w.fit(l.description, cols.qty - cols.description - 40), cols.description);
    w.right(String(l.quantity), cols.qty);
    w.right(money(l.unitPriceMinor), cols.unit);
    w.right(money(l.quantity * (l.unitPriceMinor + l.coreDepositMinor)), cols.total);
    if (l.coreDepositMinor > 0) {
      w.down(12);
      w.text(`  includes a refundable core deposit of ${money(l.coreDepositMinor)} a unit`, cols.description, 8);
    }
    w.down(16);
  }
  w.down(4);
  w.rule(10);
  w.right(`Total ${money(input.totalMinor)}`, cols.total, 12, bold);
  if (input.note) {
    w.down(28);
    w.text(w.fit(`Note: ${input.note}`, w.contentWidth), margin);
  }
  w.footer(`Please quote ${input.reference} on the delivery note and invoice.`);
  return w.save();
}
