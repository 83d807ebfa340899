// Fixed inputs for the four A4 business documents, shared by their layout test: long enough to
// break pages, with notes, links and the odd character the standard fonts cannot print.
import type { ConsignmentSettlement } from '@tappet/contracts';
import type { EstimatePdfInput } from '../../modules/estimates/estimate-pdf';
import type { InvoicePdfInput } from '../../modules/sales/invoice-pdf';
import type { OrderPdfInput } from '../../modules/purchasing/order-pdf';
import type { SettlementPdfInput } from '../../modules/consignment/settlement-pdf';

const shopAddress = 'Unit 4, Gearwheel Yard\nLower Millbrook\nMB7 2QT';
const many = <T>(n: number, make: (i: number) => T): T[] => Array.from({ length: n }, (_, i) => make(i));

export const orderInput = (lines = 70): OrderPdfInput => ({
  reference: 'PO-000042',
  shopName: 'Larkspur Classic Works',
  shopAddress,
  supplierName: 'Brindle & Hobb Spares',
  currency: 'GBP',
  date: new Date('2026-11-30T10:00:00Z'),
  note: 'Deliver to the rear gate — “mornings only”.',
  lines: many(lines, (i) => ({ partNumber: `71-${3400 + i}`, supplierNumber: i % 3 ? `BH${9000 + i}` : null, description: `Gasket set, cylinder head, late pattern ${i} with a description long enough to be cut`, quantity: 1 + (i % 4), unitPriceMinor: 1250 + i, coreDepositMinor: i % 10 === 0 ? 500 : 0 })),
  totalMinor: 987654,
});

export const invoiceInput = (lines = 60): InvoicePdfInput => ({
  title: 'Invoice',
  number: 'INV-000007',
  issuedOn: '2026-11-30',
  shopName: 'Larkspur Classic Works',
  shopAddress,
  customerName: 'Imogen Threlkeld',
  customerAddress: '12 Quarry Row\nEastcombe Magna',
  currency: 'EUR',
  reference: 'Job 118',
  lines: many(lines, (i) => ({ description: `Brake shoe relining ${i} — front axle`, quantity: String(1 + (i % 3)), unitPriceMinor: 4500, discountPercent: i % 5 === 0 ? 10 : 0, taxRatePercent: i % 2 ? 20 : 5, netMinor: 4500 * (1 + (i % 3)) })),
  taxByRate: [
    { ratePercent: 5, netMinor: 100000, taxMinor: 5000 },
    { ratePercent: 20, netMinor: 200000, taxMinor: 40000 },
  ],
  netMinor: 300000,
  taxMinor: 45000,
  grossMinor: 345000,
  paidMinor: 10000,
  creditedMinor: 0,
  dueMinor: 335000,
  payUrl: 'http://tappet.test/api/pay/abcdefghijklmnopqrstuvwxyz0123456789',
  notes: 'Thank you. Payment within 14 days.',
});

export const estimateInput = (lines = 60): EstimatePdfInput => ({
  reference: 'EST-000003',
  version: 2,
  shopName: 'Larkspur Classic Works',
  shopAddress,
  customerName: 'Imogen Threlkeld',
  vehicle: '1962 Wrenfield Sparrow 1100 saloon',
  jobTitle: 'Recommission after long storage',
  currency: 'GBP',
  date: new Date('2026-11-28T09:00:00Z'),
  note: 'Tyres older than six years should be replaced before road use.',
  lines: many(lines, (i) => ({ description: `Line ${i}: flush and refill the braking system`, quantity: i % 2 ? '1.5' : '2', kind: i % 2 ? 'labour' : 'part', unitPriceMinor: 6000, taxRatePercent: 20, netMinor: 9000 })),
  netMinor: 540000,
  taxMinor: 108000,
  grossMinor: 648000,
  taxByRate: [{ ratePercent: 20, netMinor: 540000, taxMinor: 108000 }],
  approvalUrl: 'http://tappet.test/estimate-approval/0123456789abcdef',
  linkExpiresAt: new Date('2026-12-12T00:00:00Z'),
});

const settlement: ConsignmentSettlement = {
  id: '00000000-0000-4000-8000-000000000001',
  reference: 'CS-000001',
  soldOn: '2026-11-20',
  salePriceMinor: 1850000,
  commissionKind: 'percent',
  commissionPercent: 12.5,
  commissionFixedMinor: null,
  commissionMinor: 231250,
  work: [{ jobId: '00000000-0000-4000-8000-000000000003', jobNumber: 31, title: 'Carburettor overhaul and a very long description of the work done to the car', estimateReference: 'EST-000011', approvedMinor: 60000, actualGrossMinor: 58000, chargedMinor: 58000 }],
  workMinor: 58000,
  payoutMinor: 1560750,
  consignorOwesMinor: 0,
  note: 'Sold at the autumn open day.',
  createdAt: '2026-11-21T10:00:00.000Z',
  payout: { paidOn: '2026-11-25', method: 'bank_transfer', reference: 'LCW-0091', recordedAt: '2026-11-25T16:00:00.000Z' },
};

export const settlementInput = (): SettlementPdfInput => ({ settlement, shopName: 'Larkspur Classic Works', shopAddress, consignorName: 'Odell Brackenridge', vehicle: '1958 Harrowgate Kestrel roadster', currency: 'GBP' });
