import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { formatMoney } from '@tappet/domain';
import { fitText, printable } from '../../lib/pdf-text';

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
  const doc = await PDFDocument.create();
  doc.setTitle(`${input.title} ${input.number ?? '(draft)'}`);
  doc.setCreator('Tappet');
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const money = (minor: number) => formatMoney(minor, input.currency);
  const [width, height] = [595.28, 841.89];
  const margin = 48;
  let page: PDFPage = doc.addPage([width, height]);
  let y = height - margin;
  const ink = rgb(0.12, 0.11, 0.1);
  const text = (s: string, x: number, size = 10, f: PDFFont = font) => page.drawText(printable(s), { x, y, size, font: f, color: ink });
  const right = (s: string, xRight: number, size = 10, f: PDFFont = font) => {
    const p = printable(s);
    page.drawText(p, { x: xRight - f.widthOfTextAtSize(p, size), y, size, font: f, color: ink });
  };
  const fit = (s: string, max: number, size = 10) => fitText(font, s, max, size);
  const rule = () => page.drawLine({ start: { x: margin, y }, end: { x: width - margin, y }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });

  text(`${input.title} ${input.number ?? '(draft, not issued)'}`, margin, 18, bold);
  y -= 24;
  text(`Date: ${input.issuedOn ?? 'not issued'}`, margin);
  if (input.reference) text(input.reference, width / 2);
  y -= 22;
  text('From', margin, 9, bold);
  text('To', width / 2, 9, bold);
  y -= 14;
  text(input.shopName, margin);
  text(input.customerName, width / 2);
  const shopLines = input.shopAddress.split(/\r?\n/).filter(Boolean).slice(0, 4);
  const customerLines = (input.customerAddress ?? '').split(/\r?\n/).filter(Boolean).slice(0, 4);
  for (let i = 0; i < Math.max(shopLines.length, customerLines.length); i++) {
    y -= 13;
    if (shopLines[i]) text(shopLines[i]!, margin);
    if (customerLines[i]) text(customerLines[i]!, width / 2);
  }
  y -= 28;
  const cols = { description: margin, qty: width - margin - 230, unit: width - margin - 160, tax: width - margin - 90, total: width - margin };
  const header = () => {
    text('Description', cols.description, 9, bold);
    right('Qty', cols.qty, 9, bold);
    right('Unit price', cols.unit, 9, bold);
    right('Tax', cols.tax, 9, bold);
    right('Net', cols.total, 9, bold);
    y -= 6;
    rule();
    y -= 14;
  };
  header();
  for (const l of input.lines) {
    if (y < margin + 140) {
      page = doc.addPage([width, height]);
      y = height - margin;
      header();
    }
    const discount = l.discountPercent > 0 ? ` (less ${percentText(l.discountPercent)})` : '';
    text(fit(`${l.description}${discount}`, cols.qty - cols.description - 40), cols.description);
    right(l.quantity, cols.qty);
    right(money(l.unitPriceMinor), cols.unit);
    right(percentText(l.taxRatePercent), cols.tax);
    right(money(l.netMinor), cols.total);
    y -= 16;
  }
  y += 6;
  rule();
  y -= 16;
  const total = (label: string, minor: number, f: PDFFont = font, size = 10) => {
    right(label, cols.tax, size, f);
    right(money(minor), cols.total, size, f);
    y -= 15;
  };
  total('Net', input.netMinor);
  for (const r of input.taxByRate) total(`Tax at ${percentText(r.ratePercent)} on ${money(r.netMinor)}`, r.taxMinor);
  total('Total', input.grossMinor, bold, 12);
  if (input.creditedMinor > 0) total('Credited', -input.creditedMinor);
  if (input.paidMinor > 0) total('Paid', -input.paidMinor);
  if (input.title === 'Invoice') total('Due', input.dueMinor, bold, 11);
  if (input.notes) {
    y -= 14;
    text(fit(input.notes, width - 2 * margin), margin);
  }
  if (input.payUrl && input.dueMinor > 0) {
    y -= 20;
    text('Pay by card:', margin, 9, bold);
    y -= 12;
    text(fit(input.payUrl, width - 2 * margin, 8), margin, 8);
  }
  return Buffer.from(await doc.save());
}
