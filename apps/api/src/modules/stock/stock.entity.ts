import { EntitySchema } from 'typeorm';
import type { MovementKind, StockCondition, ValuationMethod } from '@tappet/contracts';

/** A place stock sits in: aisle, shelf, bin. `codeKey` is the code upper-cased, unique per shop. */
export interface BinRow {
  id: string;
  shopId: string;
  code: string;
  codeKey: string;
  description: string | null;
  active: boolean;
  createdAt: Date;
  updatedAt: Date;
}

export const BinEntity = new EntitySchema<BinRow>({
  name: 'StockBin',
  tableName: 'stock_bins',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    code: { type: 'varchar', length: 20 },
    codeKey: { type: 'varchar', length: 20, name: 'code_key' },
    description: { type: 'varchar', length: 200, nullable: true },
    active: { type: 'boolean' },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** Cached balance of one part × bin × condition, written in the same transaction as its movements. */
export interface StockLineRow {
  shopId: string;
  partId: string;
  binId: string;
  condition: StockCondition;
  onHand: number;
  held: number;
  updatedAt: Date;
}

export const StockLineEntity = new EntitySchema<StockLineRow>({
  name: 'StockLine',
  tableName: 'stock_lines',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    partId: { type: 'varchar', length: 36, name: 'part_id', primary: true },
    binId: { type: 'varchar', length: 36, name: 'bin_id', primary: true },
    condition: { type: 'varchar', length: 20, primary: true },
    onHand: { type: 'integer', name: 'on_hand' },
    held: { type: 'integer' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** Cached valuation of one part × condition: what is on hand in every bin and what it is worth. */
export interface StockPoolRow {
  shopId: string;
  partId: string;
  condition: StockCondition;
  method: ValuationMethod;
  quantity: number;
  valueMinor: number;
  updatedAt: Date;
}

export const StockPoolEntity = new EntitySchema<StockPoolRow>({
  name: 'StockPool',
  tableName: 'stock_pools',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    partId: { type: 'varchar', length: 36, name: 'part_id', primary: true },
    condition: { type: 'varchar', length: 20, primary: true },
    method: { type: 'varchar', length: 10 },
    quantity: { type: 'integer' },
    valueMinor: { type: 'integer', name: 'value_minor' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** One serialised item (an engine, a gearbox, a frame) with its own cost. */
export interface SerialRow {
  id: string;
  shopId: string;
  partId: string;
  serial: string;
  serialKey: string;
  condition: StockCondition;
  binId: string | null;
  costMinor: number;
  inStock: boolean;
  receivedAt: Date;
}

export const SerialEntity = new EntitySchema<SerialRow>({
  name: 'StockSerial',
  tableName: 'stock_serials',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    serial: { type: 'varchar', length: 40 },
    serialKey: { type: 'varchar', length: 40, name: 'serial_key' },
    condition: { type: 'varchar', length: 20 },
    binId: { type: 'varchar', length: 36, name: 'bin_id', nullable: true },
    costMinor: { type: 'integer', name: 'cost_minor' },
    inStock: { type: 'boolean', name: 'in_stock' },
    receivedAt: { type: 'datetime', name: 'received_at' },
  },
});

export type HoldStatus = 'active' | 'released' | 'issued';

/** Stock set aside for a purpose (later: a job). `quantity` is what is still held. */
export interface HoldRow {
  id: string;
  shopId: string;
  partId: string;
  binId: string;
  condition: StockCondition;
  quantity: number;
  purpose: string;
  jobId: string | null;
  status: HoldStatus;
  createdByUserId: string | null;
  createdAt: Date;
  closedAt: Date | null;
}

export const HoldEntity = new EntitySchema<HoldRow>({
  name: 'StockHold',
  tableName: 'stock_holds',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    binId: { type: 'varchar', length: 36, name: 'bin_id' },
    condition: { type: 'varchar', length: 20 },
    quantity: { type: 'integer' },
    purpose: { type: 'varchar', length: 200 },
    jobId: { type: 'varchar', length: 36, name: 'job_id', nullable: true },
    status: { type: 'varchar', length: 10 },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    closedAt: { type: 'datetime', name: 'closed_at', nullable: true },
  },
});

/** One entry of the append-only ledger. */
export interface MovementRow {
  id: string;
  shopId: string;
  /** Ledger order within the shop, 1, 2, 3…; valuation folds movements in this order. */
  seq: number;
  kind: MovementKind;
  partId: string;
  binId: string;
  toBinId: string | null;
  condition: StockCondition;
  /** Change on hand in `binId`; a move adds −quantityDelta to `toBinId`. */
  quantityDelta: number;
  countedQuantity: number | null;
  /** The unit cost given with the movement (receipt, costed return, found stock), not a computed one. */
  unitCostMinor: number | null;
  valueChangeMinor: number;
  serialId: string | null;
  reason: string | null;
  reference: string | null;
  note: string | null;
  holdId: string | null;
  jobId: string | null;
  occurredAt: Date;
  recordedAt: Date;
  userId: string | null;
  apiKeyId: string | null;
}

export const MovementEntity = new EntitySchema<MovementRow>({
  name: 'StockMovement',
  tableName: 'stock_movements',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    seq: { type: 'integer' },
    kind: { type: 'varchar', length: 10 },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    binId: { type: 'varchar', length: 36, name: 'bin_id' },
    toBinId: { type: 'varchar', length: 36, name: 'to_bin_id', nullable: true },
    condition: { type: 'varchar', length: 20 },
    quantityDelta: { type: 'integer', name: 'quantity_delta' },
    countedQuantity: { type: 'integer', name: 'counted_quantity', nullable: true },
    unitCostMinor: { type: 'integer', name: 'unit_cost_minor', nullable: true },
    valueChangeMinor: { type: 'integer', name: 'value_change_minor' },
    serialId: { type: 'varchar', length: 36, name: 'serial_id', nullable: true },
    reason: { type: 'varchar', length: 200, nullable: true },
    reference: { type: 'varchar', length: 120, nullable: true },
    note: { type: 'varchar', length: 500, nullable: true },
    holdId: { type: 'varchar', length: 36, name: 'hold_id', nullable: true },
    jobId: { type: 'varchar', length: 36, name: 'job_id', nullable: true },
    occurredAt: { type: 'datetime', name: 'occurred_at' },
    recordedAt: { type: 'datetime', name: 'recorded_at' },
    userId: { type: 'varchar', length: 36, name: 'user_id', nullable: true },
    apiKeyId: { type: 'varchar', length: 36, name: 'api_key_id', nullable: true },
  },
});

/** The stock module's entity schemas, for the data source. */
export const stockEntities = [BinEntity, StockLineEntity, StockPoolEntity, SerialEntity, HoldEntity, MovementEntity];
