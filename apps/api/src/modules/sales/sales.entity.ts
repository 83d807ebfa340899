import { EntitySchema } from 'typeorm';
import type { InvoiceKind, InvoiceSource, InvoiceStatus, LineKind, PaymentMethod } from './sales.types';

// Sales tables (migration 1765700000000-sales). Money in integer minor units; quantities and
// percentages as exact decimal text/numbers.

export interface InvoiceRow {
  id: string;
  shopId: string;
  kind: InvoiceKind;
  status: InvoiceStatus;
  number: number | null;
  source: InvoiceSource;
  customerId: string | null;
  customerName: string;
  customerEmail: string | null;
  customerAddress: string | null;
  notes: string | null;
  jobId: string | null;
  vehicleId: string | null;
  creditedInvoiceId: string | null;
  creditReason: string | null;
  currency: string;
  taxRounding: 'per-line' | 'per-document';
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  /** JSON: [{ ratePercent, netMinor, taxMinor }]. */
  taxByRate: string;
  payToken: string | null;
  createdByUserId: string | null;
  createdAt: Date;
  updatedAt: Date;
  issuedAt: Date | null;
  emailedAt: Date | null;
}

export const InvoiceEntity = new EntitySchema<InvoiceRow>({
  name: 'Invoice',
  tableName: 'invoices',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    kind: { type: 'varchar', length: 20 },
    status: { type: 'varchar', length: 10 },
    number: { type: 'integer', nullable: true },
    source: { type: 'varchar', length: 10 },
    customerId: { type: 'varchar', length: 36, name: 'customer_id', nullable: true },
    customerName: { type: 'varchar', length: 120, name: 'customer_name' },
    customerEmail: { type: 'varchar', length: 254, name: 'customer_email', nullable: true },
    customerAddress: { type: 'varchar', length: 500, name: 'customer_address', nullable: true },
    notes: { type: 'varchar', length: 1000, nullable: true },
    jobId: { type: 'varchar', length: 36, name: 'job_id', nullable: true },
    vehicleId: { type: 'varchar', length: 36, name: 'vehicle_id', nullable: true },
    creditedInvoiceId: { type: 'varchar', length: 36, name: 'credited_invoice_id', nullable: true },
    creditReason: { type: 'varchar', length: 500, name: 'credit_reason', nullable: true },
    currency: { type: 'varchar', length: 3 },
    taxRounding: { type: 'varchar', length: 20, name: 'tax_rounding' },
    netMinor: { type: 'integer', name: 'net_minor' },
    taxMinor: { type: 'integer', name: 'tax_minor' },
    grossMinor: { type: 'integer', name: 'gross_minor' },
    taxByRate: { type: 'text', name: 'tax_by_rate' },
    payToken: { type: 'varchar', length: 64, name: 'pay_token', nullable: true },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
    issuedAt: { type: 'datetime', name: 'issued_at', nullable: true },
    emailedAt: { type: 'datetime', name: 'emailed_at', nullable: true },
  },
});

export interface InvoiceLineRow {
  id: string;
  shopId: string;
  invoiceId: string;
  position: number;
  kind: LineKind;
  partId: string | null;
  description: string;
  quantity: string;
  unitPriceMinor: number;
  listedUnitPriceMinor: number | null;
  unitCostMinor: number | null;
  discountPercent: number;
  taxRatePercent: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  creditedLineId: string | null;
}

export const InvoiceLineEntity = new EntitySchema<InvoiceLineRow>({
  name: 'InvoiceLine',
  tableName: 'invoice_lines',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    invoiceId: { type: 'varchar', length: 36, name: 'invoice_id' },
    position: { type: 'integer' },
    kind: { type: 'varchar', length: 10 },
    partId: { type: 'varchar', length: 36, name: 'part_id', nullable: true },
    description: { type: 'varchar', length: 200 },
    quantity: { type: 'varchar', length: 20 },
    unitPriceMinor: { type: 'integer', name: 'unit_price_minor' },
    listedUnitPriceMinor: { type: 'integer', name: 'listed_unit_price_minor', nullable: true },
    unitCostMinor: { type: 'integer', name: 'unit_cost_minor', nullable: true },
    discountPercent: { type: 'real', name: 'discount_percent' },
    taxRatePercent: { type: 'real', name: 'tax_rate_percent' },
    netMinor: { type: 'integer', name: 'net_minor' },
    taxMinor: { type: 'integer', name: 'tax_minor' },
    grossMinor: { type: 'integer', name: 'gross_minor' },
    creditedLineId: { type: 'varchar', length: 36, name: 'credited_line_id', nullable: true },
  },
});

export interface PaymentRow {
  id: string;
  shopId: string;
  invoiceId: string;
  method: PaymentMethod;
  amountMinor: number;
  receivedOn: string;
  reference: string | null;
  stripeSessionId: string | null;
  recordedByUserId: string | null;
  createdAt: Date;
}

export const PaymentEntity = new EntitySchema<PaymentRow>({
  name: 'InvoicePayment',
  tableName: 'invoice_payments',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    invoiceId: { type: 'varchar', length: 36, name: 'invoice_id' },
    method: { type: 'varchar', length: 20 },
    amountMinor: { type: 'integer', name: 'amount_minor' },
    receivedOn: { type: 'varchar', length: 10, name: 'received_on' },
    reference: { type: 'varchar', length: 120, nullable: true },
    stripeSessionId: { type: 'varchar', length: 255, name: 'stripe_session_id', nullable: true },
    recordedByUserId: { type: 'varchar', length: 36, name: 'recorded_by_user_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

export interface CardSessionRow {
  id: string;
  shopId: string;
  invoiceId: string;
  amountMinor: number;
  status: 'open' | 'paid' | 'expired';
  createdAt: Date;
  completedAt: Date | null;
}

export const CardSessionEntity = new EntitySchema<CardSessionRow>({
  name: 'InvoiceCardSession',
  tableName: 'invoice_card_sessions',
  columns: {
    id: { type: 'varchar', length: 255, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    invoiceId: { type: 'varchar', length: 36, name: 'invoice_id' },
    amountMinor: { type: 'integer', name: 'amount_minor' },
    status: { type: 'varchar', length: 10 },
    createdAt: { type: 'datetime', name: 'created_at' },
    completedAt: { type: 'datetime', name: 'completed_at', nullable: true },
  },
});

export const salesEntities = [InvoiceEntity, InvoiceLineEntity, PaymentEntity, CardSessionEntity];
