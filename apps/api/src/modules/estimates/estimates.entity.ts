import { EntitySchema } from 'typeorm';
import type { EstimateLineKind, EstimateStatus } from '@tappet/contracts';

// Tables of migration 1765800000000-estimates-and-consignment (estimates part).

const id = { type: 'varchar', length: 36 } as const;
const nullableId = (name: string) => ({ type: 'varchar', length: 36, name, nullable: true }) as const;

/** One version of an estimate for a job. A revision is a new row with the same number. */
export interface EstimateRow {
  id: string;
  shopId: string;
  number: number;
  version: number;
  jobId: string;
  customerId: string | null;
  status: EstimateStatus;
  currency: string;
  taxRounding: 'per-line' | 'per-document';
  note: string | null;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  /** JSON: [{ ratePercent, netMinor, taxMinor }]. */
  taxByRate: string;
  sentAt: Date | null;
  sentTo: string | null;
  decidedAt: Date | null;
  decidedByName: string | null;
  approvedAmountMinor: number | null;
  declineReason: string | null;
  createdByUserId: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const EstimateEntity = new EntitySchema<EstimateRow>({
  name: 'Estimate',
  tableName: 'estimates',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    number: { type: 'integer' },
    version: { type: 'integer' },
    jobId: { ...id, name: 'job_id' },
    customerId: nullableId('customer_id'),
    status: { type: 'varchar', length: 12 },
    currency: { type: 'varchar', length: 3 },
    taxRounding: { type: 'varchar', length: 20, name: 'tax_rounding' },
    note: { type: 'varchar', length: 1000, nullable: true },
    netMinor: { type: 'integer', name: 'net_minor' },
    taxMinor: { type: 'integer', name: 'tax_minor' },
    grossMinor: { type: 'integer', name: 'gross_minor' },
    taxByRate: { type: 'text', name: 'tax_by_rate' },
    sentAt: { type: 'datetime', name: 'sent_at', nullable: true },
    sentTo: { type: 'varchar', length: 254, name: 'sent_to', nullable: true },
    decidedAt: { type: 'datetime', name: 'decided_at', nullable: true },
    decidedByName: { type: 'varchar', length: 120, name: 'decided_by_name', nullable: true },
    approvedAmountMinor: { type: 'integer', name: 'approved_amount_minor', nullable: true },
    declineReason: { type: 'varchar', length: 1000, name: 'decline_reason', nullable: true },
    createdByUserId: nullableId('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

export interface EstimateLineRow {
  id: string;
  shopId: string;
  estimateId: string;
  position: number;
  kind: EstimateLineKind;
  partId: string | null;
  description: string;
  quantity: string;
  unitPriceMinor: number;
  priceBasis: string;
  taxRatePercent: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
}

export const EstimateLineEntity = new EntitySchema<EstimateLineRow>({
  name: 'EstimateLine',
  tableName: 'estimate_lines',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    estimateId: { ...id, name: 'estimate_id' },
    position: { type: 'integer' },
    kind: { type: 'varchar', length: 10 },
    partId: nullableId('part_id'),
    description: { type: 'varchar', length: 200 },
    quantity: { type: 'varchar', length: 16 },
    unitPriceMinor: { type: 'integer', name: 'unit_price_minor' },
    priceBasis: { type: 'varchar', length: 20, name: 'price_basis' },
    taxRatePercent: { type: 'real', name: 'tax_rate_percent' },
    netMinor: { type: 'integer', name: 'net_minor' },
    taxMinor: { type: 'integer', name: 'tax_minor' },
    grossMinor: { type: 'integer', name: 'gross_minor' },
  },
});

/** An approval link: only the SHA-256 of its token is stored; single use, expiring. */
export interface EstimateLinkRow {
  id: string;
  shopId: string;
  estimateId: string;
  tokenHash: string;
  expiresAt: Date;
  usedAt: Date | null;
  revokedAt: Date | null;
  createdAt: Date;
}

export const EstimateLinkEntity = new EntitySchema<EstimateLinkRow>({
  name: 'EstimateLink',
  tableName: 'estimate_links',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    estimateId: { ...id, name: 'estimate_id' },
    tokenHash: { type: 'varchar', length: 64, name: 'token_hash' },
    expiresAt: { type: 'datetime', name: 'expires_at' },
    usedAt: { type: 'datetime', name: 'used_at', nullable: true },
    revokedAt: { type: 'datetime', name: 'revoked_at', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

export const estimateEntities = [EstimateEntity, EstimateLineEntity, EstimateLinkEntity];
