import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { formatMoney } from '@tappet/domain';
import { fitText, printable } from '../../lib/pdf-text';

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
  const doc = await PDFDocument.create();
  doc.setTitle(`Estimate ${input.reference}`);
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

  text(`Estimate ${input.reference}`, margin, 18, bold);
  y -= 24;
  text(`Date: ${input.date.toISOString().slice(0, 10)}${input.version > 1 ? `   (revision ${input.version})` : ''}`, margin);
  y -= 22;
  text('From', margin, 9, bold);
  text('For', width / 2, 9, bold);
  y -= 14;
  text(input.shopName, margin);
  text(input.customerName ?? '', width / 2);
  const address = input.shopAddress.split(/\r?\n/).filter(Boolean).slice(0, 4);
  for (const line of address) {
    y -= 13;
    text(line, margin);
  }
  y -= 22;
  text(fit(`Vehicle: ${input.vehicle}`, width - 2 * margin), margin);
  y -= 14;
  text(fit(`Work: ${input.jobTitle}`, width - 2 * margin), margin);
  y -= 26;
  const cols = { description: margin, qty: width - margin - 210, unit: width - margin - 130, tax: width - margin - 80, net: width - margin };
  const header = () => {
    text('Description', cols.description, 9, bold);
    right('Qty / hours', cols.qty, 9, bold);
    right('Unit price', cols.unit, 9, bold);
    right('Tax', cols.tax, 9, bold);
    right('Net', cols.net, 9, bold);
    y -= 6;
    page.drawLine({ start: { x: margin, y }, end: { x: width - margin, y }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });
    y -= 14;
  };
  header();
  for (const l of input.lines) {
    if (y < margin + 120) {
      page = doc.addPage([width, height]);
      y = height - margin;
      header();
    }
    text(fit(l.description, cols.qty - cols.description - 60), cols.description);
    right(l.kind === 'labour' ? `${l.quantity} h` : l.quantity, cols.qty);
    right(money(l.unitPriceMinor), cols.unit);
    right(`${l.taxRatePercent}%`, cols.tax);
    right(money(l.netMinor), cols.net);
    y -= 16;
  }
  page.drawLine({ start: { x: margin, y: y + 10 }, end: { x: width - margin, y: y + 10 }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });
  y -= 4;
  right(`Net ${money(input.netMinor)}`, cols.net);
  for (const r of input.taxByRate) {
    y -= 14;
    right(`Tax at ${r.ratePercent}% on ${money(r.netMinor)}: ${money(r.taxMinor)}`, cols.net);
  }
  y -= 18;
  right(`Total including tax ${money(input.grossMinor)}`, cols.net, 12, bold);
  if (input.note) {
    y -= 28;
    text(fit(`Note: ${input.note}`, width - 2 * margin), margin);
  }
  if (input.approvalUrl) {
    y -= 30;
    text('To approve or decline this estimate, open:', margin, 10, bold);
    y -= 14;
    text(fit(input.approvalUrl, width - 2 * margin, 8), margin, 8);
    if (input.linkExpiresAt) {
      y -= 13;
      text(`The link works once and until ${input.linkExpiresAt.toISOString().slice(0, 10)}.`, margin, 9);
    }
  }
  y = margin - 10;
  text('An estimate, not an invoice. Work beyond the approved amount is only done after a new approval.', margin, 8);
  return Buffer.from(await doc.save());
}
