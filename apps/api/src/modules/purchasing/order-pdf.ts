import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { formatMoney } from '@tappet/domain';
import { fitText, printable } from '../../lib/pdf-text';

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
  const doc = await PDFDocument.create();
  doc.setTitle(`Purchase order ${input.reference}`);
  doc.setCreator('Tappet');
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const money = (minor: number) => formatMoney(minor, input.currency);
  const [width, height] = [595.28, 841.89];
  const margin = 48;
  let page: PDFPage = doc.addPage([width, height]);
  let y = height - margin;
  const text = (s: string, x: number, size = 10, f: PDFFont = font) => page.drawText(printable(s), { x, y, size, font: f, color: rgb(0.12, 0.11, 0.1) });
  const right = (s: string, xRight: number, size = 10, f: PDFFont = font) => {
    const p = printable(s);
    page.drawText(p, { x: xRight - f.widthOfTextAtSize(p, size), y, size, font: f, color: rgb(0.12, 0.11, 0.1) });
  };
  const fit = (s: string, max: number, size = 10) => fitText(font, s, max, size);

  text(`Purchase order ${input.reference}`, margin, 18, bold);
  y -= 24;
  text(`Date: ${input.date.toISOString().slice(0, 10)}`, margin);
  y -= 22;
  text('From', margin, 9, bold);
  text('To', width / 2, 9, bold);
  y -= 14;
  text(input.shopName, margin);
  text(input.supplierName, width / 2);
  for (const line of input.shopAddress.split(/\r?\n/).filter(Boolean).slice(0, 4)) {
    y -= 13;
    text(line, margin);
  }
  y -= 28;
  const cols = { number: margin, supplier: margin + 95, description: margin + 190, qty: width - margin - 170, unit: width - margin - 90, total: width - margin };
  const header = () => {
    text('Our number', cols.number, 9, bold);
    text('Your number', cols.supplier, 9, bold);
    text('Description', cols.description, 9, bold);
    right('Qty', cols.qty, 9, bold);
    right('Unit price', cols.unit, 9, bold);
    right('Line total', cols.total, 9, bold);
    y -= 6;
    page.drawLine({ start: { x: margin, y }, end: { x: width - margin, y }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });
    y -= 14;
  };
  header();
  for (const l of input.lines) {
    if (y < margin + 60) {
      page = doc.addPage([width, height]);
      y = height - margin;
      header();
    }
    text(fit(l.partNumber, 90), cols.number);
    text(fit(l.supplierNumber ?? '', 90), cols.supplier);
    text(fit(l.description, cols.qty - cols.description - 40), cols.description);
    right(String(l.quantity), cols.qty);
    right(money(l.unitPriceMinor), cols.unit);
    right(money(l.quantity * (l.unitPriceMinor + l.coreDepositMinor)), cols.total);
    if (l.coreDepositMinor > 0) {
      y -= 12;
      text(`  includes a refundable core deposit of ${money(l.coreDepositMinor)} a unit`, cols.description, 8);
    }
    y -= 16;
  }
  y -= 4;
  page.drawLine({ start: { x: margin, y: y + 10 }, end: { x: width - margin, y: y + 10 }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });
  right(`Total ${money(input.totalMinor)}`, cols.total, 12, bold);
  if (input.note) {
    y -= 28;
    text(fit(`Note: ${input.note}`, width - 2 * margin), margin);
  }
  y = margin - 10;
  text(`Please quote ${input.reference} on the delivery note and invoice.`, margin, 8);
  return Buffer.from(await doc.save());
}
