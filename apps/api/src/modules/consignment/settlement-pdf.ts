import { formatMoney } from '@tappet/domain';
import type { ConsignmentSettlement } from '@tappet/contracts';
import { A4Writer } from '../../lib/a4-document';

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
  const w = await A4Writer.create(`Consignment settlement ${s.reference}`);
  const { margin, width, font, bold } = w;
  const money = (minor: number) => formatMoney(minor, input.currency);
  const row = (label: string, amount: string, f = font) => {
    w.text(label.length > 80 ? `${label.slice(0, 77)}...` : label, margin, 10, f);
    w.right(amount, width - margin, 10, f);
    w.down(16);
  };

  w.title(`Consignment settlement ${s.reference}`, `Sold on ${s.soldOn}`);
  w.parties({ label: 'From', name: input.shopName, address: input.shopAddress }, { label: 'To the consignor', name: input.consignorName });
  w.down(22);
  w.text(`Vehicle: ${input.vehicle}`, margin);
  w.down(28);
  row('Sale price', money(s.salePriceMinor), bold);
  const commissionLabel = s.commissionKind === 'percent' ? `Commission, ${s.commissionPercent}% of the sale price` : 'Commission, fixed as agreed';
  row(`less ${commissionLabel}`, `-${money(s.commissionMinor)}`);
  for (const x of s.work) row(`less approved work: job ${x.jobNumber} ${x.title} (estimate ${x.estimateReference}, approved ${money(x.approvedMinor)})`, `-${money(x.chargedMinor)}`);
  w.down(-6);
  w.rule();
  w.down(16);
  if (s.consignorOwesMinor > 0) row('Owed to the shop by the consignor', money(s.consignorOwesMinor), bold);
  else row('Payout to the consignor', money(s.payoutMinor), bold);
  if (s.note) {
    w.down(10);
    w.text(`Note: ${s.note.slice(0, 110)}`, margin);
    w.down(16);
  }
  w.down(16);
  if (s.payout) w.text(`Paid on ${s.payout.paidOn} by ${methodWords[s.payout.method]}, reference ${s.payout.reference}.`, margin, 10, bold);
  else w.text('Not paid yet.', margin);
  w.footer('Approved work is charged at its sell value, tax included, and never above the amount the consignor approved.');
  return w.save();
}
