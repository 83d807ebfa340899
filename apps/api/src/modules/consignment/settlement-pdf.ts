import { PDFDocument, StandardFonts, rgb, type PDFFont } from 'pdf-lib';
import { formatMoney } from '@tappet/domain';
import type { ConsignmentSettlement } from '@tappet/contracts';
import { printable } from '../../lib/pdf-text';

export interface SettlementPdfInput {
  settlement: ConsignmentSettlement;
  shopName: string;
  shopAddress: string;
  consignorName: string;
  vehicle: string;
  currency: string;
}

const methodWords = { bank_transfer: 'bank transfer', cheque: 'cheque', cash: 'cash' } as const;

/**
 * A consignment settlement as a one-page A4 PDF (pdf-lib, Helvetica): the sale price, the
 * commission as agreed, each piece of approved work with what it is charged at, the payout, and
 * the payment once recorded.
 */
export async function renderSettlementPdf(input: SettlementPdfInput): Promise<Buffer> {
  const s = input.settlement;
  const doc = await PDFDocument.create();
  doc.setTitle(`Consignment settlement ${s.reference}`);
  doc.setCreator('Tappet');
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const money = (minor: number) => formatMoney(minor, input.currency);
  const [width, height] = [595.28, 841.89];
  const margin = 48;
  const page = doc.addPage([width, height]);
  let y = height - margin;
  const ink = rgb(0.12, 0.11, 0.1);
  const text = (t: string, x: number, size = 10, f: PDFFont = font) => page.drawText(printable(t), { x, y, size, font: f, color: ink });
  const right = (t: string, xRight: number, size = 10, f: PDFFont = font) => {
    const p = printable(t);
    page.drawText(p, { x: xRight - f.widthOfTextAtSize(p, size), y, size, font: f, color: ink });
  };
  const row = (label: string, amount: string, f: PDFFont = font) => {
    text(label.length > 80 ? `${label.slice(0, 77)}...` : label, margin, 10, f);
    right(amount, width - margin, 10, f);
    y -= 16;
  };

  text(`Consignment settlement ${s.reference}`, margin, 18, bold);
  y -= 24;
  text(`Sold on ${s.soldOn}`, margin);
  y -= 22;
  text('From', margin, 9, bold);
  text('To the consignor', width / 2, 9, bold);
  y -= 14;
  text(input.shopName, margin);
  text(input.consignorName, width / 2);
  for (const line of input.shopAddress.split(/\r?\n/).filter(Boolean).slice(0, 4)) {
    y -= 13;
    text(line, margin);
  }
  y -= 22;
  text(`Vehicle: ${input.vehicle}`, margin);
  y -= 28;
  row('Sale price', money(s.salePriceMinor), bold);
  const commissionLabel = s.commissionKind === 'percent' ? `Commission, ${s.commissionPercent}% of the sale price` : 'Commission, fixed as agreed';
  row(`less ${commissionLabel}`, `-${money(s.commissionMinor)}`);
  for (const w of s.work) row(`less approved work: job ${w.jobNumber} ${w.title} (estimate ${w.estimateReference}, approved ${money(w.approvedMinor)})`, `-${money(w.chargedMinor)}`);
  y += 6;
  page.drawLine({ start: { x: margin, y }, end: { x: width - margin, y }, thickness: 0.5, color: rgb(0.4, 0.4, 0.4) });
  y -= 16;
  if (s.consignorOwesMinor > 0) row('Owed to the shop by the consignor', money(s.consignorOwesMinor), bold);
  else row('Payout to the consignor', money(s.payoutMinor), bold);
  if (s.note) {
    y -= 10;
    text(`Note: ${s.note.slice(0, 110)}`, margin);
    y -= 16;
  }
  y -= 16;
  if (s.payout) text(`Paid on ${s.payout.paidOn} by ${methodWords[s.payout.method]}, reference ${s.payout.reference}.`, margin, 10, bold);
  else text('Not paid yet.', margin);
  y = margin - 10;
  text('Approved work is charged at its sell value, tax included, and never above the amount the consignor approved.', margin, 8);
  return Buffer.from(await doc.save());
}
