import { EntitySchema } from 'typeorm';
import type { ConsignmentWorkLine, PayoutMethod } from '@tappet/contracts';

// Tables of migration 1765800000000-estimates-and-consignment (consignment part).

const id = { type: 'varchar', length: 36 } as const;
const nullableId = (name: string) => ({ type: 'varchar', length: 36, name, nullable: true }) as const;

/** The commission agreed when a consigned vehicle came in. One per vehicle. */
export interface ConsignmentTermsRow {
  id: string;
  shopId: string;
  vehicleId: string;
  commissionKind: 'percent' | 'fixed';
  /** Thousandths of a percent (12.5 % → 12500). */
  commissionMilliPercent: number | null;
  commissionFixedMinor: number | null;
  agreedOn: string;
  note: string | null;
  createdByUserId: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const ConsignmentTermsEntity = new EntitySchema<ConsignmentTermsRow>({
  name: 'ConsignmentTerms',
  tableName: 'consignment_terms',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    vehicleId: { ...id, name: 'vehicle_id' },
    commissionKind: { type: 'varchar', length: 10, name: 'commission_kind' },
    commissionMilliPercent: { type: 'integer', name: 'commission_milli_percent', nullable: true },
    commissionFixedMinor: { type: 'integer', name: 'commission_fixed_minor', nullable: true },
    agreedOn: { type: 'varchar', length: 10, name: 'agreed_on' },
    note: { type: 'varchar', length: 1000, nullable: true },
    createdByUserId: nullableId('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** The settlement with the consignor after the sale: figures frozen when it is made. */
export interface ConsignmentSettlementRow {
  id: string;
  shopId: string;
  number: number;
  vehicleId: string;
  consignorCustomerId: string | null;
  soldOn: string;
  currency: string;
  salePriceMinor: number;
  commissionKind: 'percent' | 'fixed';
  commissionMilliPercent: number | null;
  commissionFixedMinor: number | null;
  commissionMinor: number;
  work: ConsignmentWorkLine[];
  workMinor: number;
  payoutMinor: number;
  note: string | null;
  createdByUserId: string | null;
  createdAt: Date;
  paidOn: string | null;
  payoutMethod: PayoutMethod | null;
  payoutReference: string | null;
  payoutRecordedByUserId: string | null;
  payoutRecordedAt: Date | null;
}

export const ConsignmentSettlementEntity = new EntitySchema<ConsignmentSettlementRow>({
  name: 'ConsignmentSettlement',
  tableName: 'consignment_settlements',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    number: { type: 'integer' },
    vehicleId: { ...id, name: 'vehicle_id' },
    consignorCustomerId: nullableId('consignor_customer_id'),
    soldOn: { type: 'varchar', length: 10, name: 'sold_on' },
    currency: { type: 'varchar', length: 3 },
    salePriceMinor: { type: 'integer', name: 'sale_price_minor' },
    commissionKind: { type: 'varchar', length: 10, name: 'commission_kind' },
    commissionMilliPercent: { type: 'integer', name: 'commission_milli_percent', nullable: true },
    commissionFixedMinor: { type: 'integer', name: 'commission_fixed_minor', nullable: true },
    commissionMinor: { type: 'integer', name: 'commission_minor' },
    work: { type: 'simple-json' },
    workMinor: { type: 'integer', name: 'work_minor' },
    payoutMinor: { type: 'integer', name: 'payout_minor' },
    note: { type: 'varchar', length: 1000, nullable: true },
    createdByUserId: nullableId('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
    paidOn: { type: 'varchar', length: 10, name: 'paid_on', nullable: true },
    payoutMethod: { type: 'varchar', length: 20, name: 'payout_method', nullable: true },
    payoutReference: { type: 'varchar', length: 120, name: 'payout_reference', nullable: true },
    payoutRecordedByUserId: nullableId('payout_recorded_by_user_id'),
    payoutRecordedAt: { type: 'datetime', name: 'payout_recorded_at', nullable: true },
  },
});

export const consignmentEntities = [ConsignmentTermsEntity, ConsignmentSettlementEntity];
