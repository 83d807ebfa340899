import { EntitySchema } from 'typeorm';
import type { CountStatus, StockCondition } from '@tappet/contracts';

/** A stock count: its scope, and the ledger position (`freezeSeq`) its expected quantities were frozen at. */
export interface StockCountRow {
  id: string;
  shopId: string;
  number: number;
  status: CountStatus;
  scopeKind: 'bins' | 'categories';
  /** JSON: the bin ids or category names chosen. */
  scopeJson: string;
  note: string | null;
  /** The highest movement `seq` of the shop when the count started. */
  freezeSeq: number;
  startedAt: Date;
  startedByUserId: string | null;
  closedAt: Date | null;
  closedByUserId: string | null;
}

export const StockCountEntity = new EntitySchema<StockCountRow>({
  name: 'StockCount',
  tableName: 'stock_counts',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    number: { type: 'integer' },
    status: { type: 'varchar', length: 10 },
    scopeKind: { type: 'varchar', length: 10, name: 'scope_kind' },
    scopeJson: { type: 'text', name: 'scope_json' },
    note: { type: 'varchar', length: 500, nullable: true },
    freezeSeq: { type: 'integer', name: 'freeze_seq' },
    startedAt: { type: 'datetime', name: 'started_at' },
    startedByUserId: { type: 'varchar', length: 36, name: 'started_by_user_id', nullable: true },
    closedAt: { type: 'datetime', name: 'closed_at', nullable: true },
    closedByUserId: { type: 'varchar', length: 36, name: 'closed_by_user_id', nullable: true },
  },
});

/** One line of a count: frozen at the start, counted later (the last entry wins, or adds). */
export interface StockCountLineRow {
  id: string;
  shopId: string;
  countId: string;
  partId: string;
  binId: string;
  condition: StockCondition;
  frozenQuantity: number;
  added: boolean;
  countedQuantity: number | null;
  /** Net movements on the line between the freeze and the latest entry. */
  movedSinceFreeze: number | null;
  countedAt: Date | null;
  countedByUserId: string | null;
  postedMovementId: string | null;
}

export const StockCountLineEntity = new EntitySchema<StockCountLineRow>({
  name: 'StockCountLine',
  tableName: 'stock_count_lines',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    countId: { type: 'varchar', length: 36, name: 'count_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    binId: { type: 'varchar', length: 36, name: 'bin_id' },
    condition: { type: 'varchar', length: 20 },
    frozenQuantity: { type: 'integer', name: 'frozen_quantity' },
    added: { type: 'boolean' },
    countedQuantity: { type: 'integer', name: 'counted_quantity', nullable: true },
    movedSinceFreeze: { type: 'integer', name: 'moved_since_freeze', nullable: true },
    countedAt: { type: 'datetime', name: 'counted_at', nullable: true },
    countedByUserId: { type: 'varchar', length: 36, name: 'counted_by_user_id', nullable: true },
    postedMovementId: { type: 'varchar', length: 36, name: 'posted_movement_id', nullable: true },
  },
});

export const countEntities = [StockCountEntity, StockCountLineEntity];
