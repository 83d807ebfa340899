import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { closingPosition, normalisePartNumber, ValuationError, type LineageGraph, type StockMovement } from '@tappet/domain';
import type { AuditAction, AuditEntity, Bin, BinInput, binInputSchema, BinUpdate, binUpdateSchema, Hold, MovementKind, MovementWriteResponse, PartStockResponse, StockCondition, ValuationMethod } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { countHolds, currencyOf, freeStockByPart, isoOf, listBins, listHolds, listMovements, listStock, valuationCsv, valuationReport, valueHistory, type MovementFilters, type StockListFilters } from './stock.queries';
import { HttpError, notFound } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity, type PartRow } from '../catalogue/catalogue.entity';
import { BinEntity, HoldEntity, MovementEntity, SerialEntity, StockLineEntity, StockPoolEntity, type BinRow, type HoldRow, type MovementRow, type SerialRow, type StockLineRow, type StockPoolRow } from './stock.entity';

// The stock ledger's internal API. Every function here takes the EntityManager of a db.write()
// that the caller already holds, so other modules (purchase receipts, job parts, counter sales,
// vehicle fitment) can move stock inside their own transaction: their change, the movements, the
// cached balances and the audit events commit or roll back together. None of them awaits network
// I/O. Each appends movements, updates the cached line and pool in the same transaction and
// records an audit event. Ids are looked up within the shop: another shop's id is a 404.

/** Who moves stock, when, and (optionally) when it physically happened (back-dated entries, seeds). */
export interface StockWriteContext {
  actor: AuditActor;
  /** When the entry is recorded. */
  at: Date;
  /** When the movement happened; `at` when left out. */
  occurredAt?: Date;
}

/** A line (part × bin × condition) of the ledger. */
export interface LineRef {
  partId: string;
  binId: string;
  condition: StockCondition;
}

/** Optional labels a movement carries. `jobId` is for the jobs module once it exists. */
export interface MovementLabels {
  reference?: string | null;
  note?: string | null;
  jobId?: string | null;
}

/** 409 with a machine-readable reason in `details.reason` (the web app words it). */
export function stockConflict(reason: string, message: string, details: Record<string, unknown> = {}): HttpError {
  return new HttpError(409, 'conflict', message, { reason, ...details });
}

const noSuchPart = () => notFound('No such part in this shop.');
const noSuchBin = () => notFound('No such bin in this shop.');

async function partOf(manager: EntityManager, shopId: string, partId: string): Promise<PartRow> {
  const part = await shopScoped(manager, PartEntity, shopId).findOne({ id: partId });
  if (!part) throw noSuchPart();
  return part;
}

async function binOf(manager: EntityManager, shopId: string, binId: string, mustBeActive: boolean): Promise<BinRow> {
  const bin = await shopScoped(manager, BinEntity, shopId).findOne({ id: binId });
  if (!bin) throw noSuchBin();
  if (mustBeActive && !bin.active) throw stockConflict('bin_inactive', `Bin ${bin.code} is no longer in use: choose another bin.`);
  return bin;
}

async function lineOf(manager: EntityManager, shopId: string, ref: LineRef, at: Date): Promise<StockLineRow> {
  const row = await shopScoped(manager, StockLineEntity, shopId).findOne({ partId: ref.partId, binId: ref.binId, condition: ref.condition });
  return row ?? { shopId, partId: ref.partId, binId: ref.binId, condition: ref.condition, onHand: 0, held: 0, updatedAt: at };
}

async function saveLine(manager: EntityManager, line: StockLineRow): Promise<void> {
  const where = { shopId: line.shopId, partId: line.partId, binId: line.binId, condition: line.condition };
  const exists = await manager.getRepository(StockLineEntity).exists({ where });
  if (exists) await manager.update(StockLineEntity, where, { onHand: line.onHand, held: line.held, updatedAt: line.updatedAt });
  else await manager.insert(StockLineEntity, line);
}

async function poolOf(manager: EntityManager, shopId: string, partId: string, condition: StockCondition, at: Date): Promise<StockPoolRow & { isNew: boolean }> {
  const row = await shopScoped(manager, StockPoolEntity, shopId).findOne({ partId, condition });
  return row ? { ...row, isNew: false } : { shopId, partId, condition, method: 'average', quantity: 0, valueMinor: 0, updatedAt: at, isNew: true };
}

async function savePool(manager: EntityManager, pool: StockPoolRow & { isNew: boolean }): Promise<void> {
  const { isNew, ...row } = pool;
  if (isNew) await manager.insert(StockPoolEntity, row);
  else await manager.update(StockPoolEntity, { shopId: row.shopId, partId: row.partId, condition: row.condition }, { method: row.method, quantity: row.quantity, valueMinor: row.valueMinor, updatedAt: row.updatedAt });
}

/**
 * Applies one movement to an average-cost pool with the valuation library (moving weighted-average,
 * IAS 2 ¶27; rounding policy in docs/decisions/013-stock-ledger-and-valuation.md) and returns the
 * value it moved. Refusals become 409s; nothing has been written yet when they are thrown.
 */
function averageValueChange(pool: StockPoolRow, movement: StockMovement): number {
  try {
    const after = closingPosition([movement], { quantity: pool.quantity, value: pool.valueMinor });
    return after.value - pool.valueMinor;
  } catch (error) {
    if (error instanceof ValuationError) {
      if (error.code === 'no_cost_basis') throw stockConflict('no_cost_basis', 'Nothing of this part and condition is on hand to take an average cost from: give the unit cost.');
      if (error.code === 'insufficient_stock') throw stockConflict('insufficient_stock', 'Not that many are on hand.');
      throw new HttpError(400, 'bad_request', error.message);
    }
    throw error;
  }
}

async function nextSeq(manager: EntityManager, shopId: string): Promise<number> {
  const [row] = await manager.query<Array<{ seq: number }>>(`SELECT COALESCE(MAX(seq), 0) + 1 AS seq FROM stock_movements WHERE shop_id = ?`, [shopId]);
  return Number(row?.seq ?? 1);
}

type MovementFields = Omit<MovementRow, 'id' | 'shopId' | 'seq' | 'occurredAt' | 'recordedAt' | 'userId' | 'apiKeyId' | 'reference' | 'note' | 'jobId'>;

async function appendMovement(manager: EntityManager, shopId: string, fields: MovementFields, labels: MovementLabels, ctx: StockWriteContext): Promise<MovementRow> {
  const row: MovementRow = {
    id: randomUUID(),
    shopId,
    seq: await nextSeq(manager, shopId),
    ...fields,
    reference: labels.reference ?? null,
    note: labels.note ?? null,
    jobId: labels.jobId ?? null,
    occurredAt: ctx.occurredAt ?? ctx.at,
    recordedAt: ctx.at,
    userId: ctx.actor.userId,
    apiKeyId: ctx.actor.apiKeyId ?? null,
  };
  await manager.insert(MovementEntity, row);
  return row;
}

async function audit(manager: EntityManager, shopId: string, ctx: StockWriteContext, action: AuditAction, entity: AuditEntity, entityId: string, fields: Record<string, unknown>): Promise<void> {
  const changes = Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined && v !== null).map(([k, v]) => [k, { before: null, after: v }]));
  await recordAudit(manager, { shopId, actor: ctx.actor, action, entity, entityId, changes, at: ctx.at });
}

/** Serialised pools take numbered items only; counted pools take none. An empty pool may switch. */
function requireMethod(pool: StockPoolRow & { isNew: boolean }, method: ValuationMethod, part: PartRow): void {
  if (pool.method === method) return;
  if (pool.quantity === 0) {
    pool.method = method;
    return;
  }
  throw method === 'specific'
    ? stockConflict('not_serialised', `${part.number} in this condition is counted, not tracked by serial number: receive it without serial numbers.`)
    : stockConflict('serialised', `${part.number} in this condition is tracked by serial number: give the number of each item.`);
}

async function serialInStock(manager: EntityManager, shopId: string, partId: string, serial: string | undefined, where: { binId?: string; condition: StockCondition }, part: PartRow): Promise<SerialRow> {
  if (!serial) throw stockConflict('serial_required', `${part.number} is tracked by serial number: say which item.`);
  const row = await shopScoped(manager, SerialEntity, shopId).findOne({ partId, serialKey: normalisePartNumber(serial), inStock: true });
  if (!row || row.condition !== where.condition || (where.binId && row.binId !== where.binId)) throw stockConflict('serial_not_here', `No item numbered ${serial} of ${part.number} is on hand in that bin and condition.`);
  return row;
}

function requireFree(line: StockLineRow, quantity: number, part: PartRow): void {
  const free = Math.max(0, line.onHand - line.held);
  if (quantity > free) {
    throw stockConflict('insufficient_free_stock', free === 0 ? `No free stock of ${part.number} in that bin and condition.` : `Only ${free} of ${part.number} free in that bin and condition.`, { free, onHand: line.onHand, held: line.held });
  }
}

/** Goods received into a bin at a unit cost (moving average), or numbered items each at its own cost. */
export interface ReceiveStock extends LineRef, MovementLabels {
  quantity: number;
  unitCostMinor: number;
  /** Serialised items: exactly `quantity` numbers. */
  serials?: string[];
}

/**
 * Receives stock: appends `received` movements (one per serialised item), raises the line and the
 * valuation pool, and recomputes the moving average. Refuses an inactive bin (409), a serial
 * already on hand (409) and mixing serialised and counted stock in one pool (409).
 */
export async function receiveStock(manager: EntityManager, shopId: string, input: ReceiveStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, true);
  const line = await lineOf(manager, shopId, input, ctx.at);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  const movements: MovementRow[] = [];
  if (input.serials && input.serials.length > 0) {
    if (input.serials.length !== input.quantity) throw new HttpError(400, 'bad_request', 'Give one serial number for each unit received.');
    requireMethod(pool, 'specific', part);
    for (const serial of input.serials) {
      const serialKey = normalisePartNumber(serial);
      if (!serialKey) throw new HttpError(400, 'bad_request', `The serial number "${serial}" has no letters or digits.`);
      const onHand = await shopScoped(manager, SerialEntity, shopId).findOne({ partId: part.id, serialKey, inStock: true });
      if (onHand) throw stockConflict('duplicate_serial', `An item numbered ${serial} of ${part.number} is already on hand.`);
      const item: SerialRow = { id: randomUUID(), shopId, partId: part.id, serial, serialKey, condition: input.condition, binId: input.binId, costMinor: input.unitCostMinor, inStock: true, receivedAt: ctx.occurredAt ?? ctx.at };
      await manager.insert(SerialEntity, item);
      movements.push(
        await appendMovement(manager, shopId, { kind: 'received', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: 1, countedQuantity: null, unitCostMinor: input.unitCostMinor, valueChangeMinor: input.unitCostMinor, serialId: item.id, reason: null, holdId: null }, input, ctx),
      );
    }
    pool.valueMinor += input.unitCostMinor * input.quantity;
  } else {
    requireMethod(pool, 'average', part);
    const change = averageValueChange(pool, { kind: 'receipt', quantity: input.quantity, unitCost: input.unitCostMinor });
    movements.push(
      await appendMovement(manager, shopId, { kind: 'received', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: input.quantity, countedQuantity: null, unitCostMinor: input.unitCostMinor, valueChangeMinor: change, serialId: null, reason: null, holdId: null }, input, ctx),
    );
    pool.valueMinor += change;
  }
  pool.quantity += input.quantity;
  pool.updatedAt = ctx.at;
  line.onHand += input.quantity;
  line.updatedAt = ctx.at;
  await saveLine(manager, line);
  await savePool(manager, pool);
  await audit(manager, shopId, ctx, 'stock.received', 'part', part.id, { bin: input.binId, condition: input.condition, quantity: input.quantity, unitCostMinor: input.unitCostMinor, serials: input.serials?.join(', '), reference: input.reference, movement: movements[0]!.id });
  return movements;
}

/** Goods leaving stock (to a job, a sale, back to a supplier): at the average, or a named item at its own cost. */
export interface IssueStock extends LineRef, MovementLabels {
  quantity: number;
  /** Serialised pools: which item. */
  serial?: string;
  /** Issue stock this hold set aside; without it only free stock can be issued. */
  holdId?: string;
}

/**
 * Issues stock. Without a hold only free stock (on hand − held) may leave; with one, the hold's
 * quantity is used up first (it closes as `issued` at zero). Refusals (409): not enough free or
 * held stock, a hold that is not active or is for another line, a serialised item not named or
 * not on hand here.
 */
export async function issueStock(manager: EntityManager, shopId: string, input: IssueStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, false);
  const line = await lineOf(manager, shopId, input, ctx.at);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  let hold: HoldRow | null = null;
  if (input.holdId) {
    hold = await shopScoped(manager, HoldEntity, shopId).findOne({ id: input.holdId });
    if (!hold) throw notFound('No such hold in this shop.');
    if (hold.status !== 'active') throw stockConflict('hold_closed', `That hold was already ${hold.status}.`);
    if (hold.partId !== input.partId || hold.binId !== input.binId || hold.condition !== input.condition) throw stockConflict('hold_mismatch', 'That hold is for another part, bin or condition.');
    if (input.quantity > hold.quantity) throw stockConflict('insufficient_held_stock', `The hold sets aside only ${hold.quantity}.`, { held: hold.quantity });
  } else {
    requireFree(line, input.quantity, part);
  }
  let valueChange: number;
  let serialId: string | null = null;
  if (pool.method === 'specific' && pool.quantity > 0) {
    if (input.quantity !== 1) throw stockConflict('serial_one_at_a_time', `${part.number} is tracked by serial number: issue one item at a time.`);
    const item = await serialInStock(manager, shopId, part.id, input.serial, { binId: input.binId, condition: input.condition }, part);
    await manager.update(SerialEntity, { id: item.id }, { inStock: false, binId: null });
    valueChange = -item.costMinor;
    serialId = item.id;
  } else {
    valueChange = averageValueChange(pool, { kind: 'issue', quantity: input.quantity });
  }
  const movement = await appendMovement(
    manager,
    shopId,
    { kind: 'issued', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: -input.quantity, countedQuantity: null, unitCostMinor: null, valueChangeMinor: valueChange, serialId, reason: null, holdId: hold?.id ?? null },
    { ...input, jobId: input.jobId ?? hold?.jobId ?? null },
    ctx,
  );
  if (hold) {
    const left = hold.quantity - input.quantity;
    await manager.update(HoldEntity, { id: hold.id }, left === 0 ? { quantity: 0, status: 'issued', closedAt: ctx.at } : { quantity: left });
    line.held -= input.quantity;
  }
  line.onHand -= input.quantity;
  line.updatedAt = ctx.at;
  pool.quantity -= input.quantity;
  pool.valueMinor += valueChange;
  pool.updatedAt = ctx.at;
  await saveLine(manager, line);
  await savePool(manager, pool);
  await audit(manager, shopId, ctx, 'stock.issued', 'part', part.id, { bin: input.binId, condition: input.condition, quantity: input.quantity, hold: hold?.id, serial: input.serial, reference: input.reference, movement: movement.id });
  return [movement];
}

/** Goods coming back from a job into a bin. */
export interface ReturnStock extends LineRef, MovementLabels {
  quantity: number;
  /** The cost it was issued at; the current average when left out. Ignored for serialised items (their own cost). */
  unitCostMinor?: number;
  serial?: string;
}

/** Returns stock to a bin: counted stock at the given cost or the average; a serialised item at its own cost. */
export async function returnStock(manager: EntityManager, shopId: string, input: ReturnStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, true);
  const line = await lineOf(manager, shopId, input, ctx.at);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  let valueChange: number;
  let serialId: string | null = null;
  let unitCost: number | null = input.unitCostMinor ?? null;
  if (input.serial) {
    requireMethod(pool, 'specific', part);
    if (input.quantity !== 1) throw stockConflict('serial_one_at_a_time', 'Return serialised items one at a time.');
    const rows = await shopScoped(manager, SerialEntity, shopId).find({ partId: part.id, serialKey: normalisePartNumber(input.serial) }, { receivedAt: 'DESC' });
    const item = rows[0];
    if (!item || item.inStock || item.condition !== input.condition) throw stockConflict('serial_not_issued', `No item numbered ${input.serial} of ${part.number} in that condition has left stock.`);
    await manager.update(SerialEntity, { id: item.id }, { inStock: true, binId: input.binId });
    valueChange = item.costMinor;
    unitCost = item.costMinor;
    serialId = item.id;
  } else {
    requireMethod(pool, 'average', part);
    valueChange = averageValueChange(pool, { kind: 'return', quantity: input.quantity, ...(input.unitCostMinor === undefined ? {} : { unitCost: input.unitCostMinor }) });
  }
  const movement = await appendMovement(
    manager,
    shopId,
    { kind: 'returned', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: input.quantity, countedQuantity: null, unitCostMinor: unitCost, valueChangeMinor: valueChange, serialId, reason: null, holdId: null },
    input,
    ctx,
  );
  line.onHand += input.quantity;
  line.updatedAt = ctx.at;
  pool.quantity += input.quantity;
  pool.valueMinor += valueChange;
  pool.updatedAt = ctx.at;
  await saveLine(manager, line);
  await savePool(manager, pool);
  await audit(manager, shopId, ctx, 'stock.returned', 'part', part.id, { bin: input.binId, condition: input.condition, quantity: input.quantity, unitCostMinor: input.unitCostMinor, serial: input.serial, reference: input.reference, movement: movement.id });
  return [movement];
}

/** A correction with a reason: damage, loss, found stock. */
export interface AdjustStock extends LineRef, MovementLabels {
  quantityDelta: number;
  /** Cost of stock found; stock written off leaves at the average. */
  unitCostMinor?: number;
  reason: string;
}

/**
 * Adjusts a counted line up or down with a reason. Only free stock can be written off (release a
 * hold first). Serialised items are not adjusted: they leave by issue and come back by return,
 * each with its number.
 */
export async function adjustStock(manager: EntityManager, shopId: string, input: AdjustStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  if (input.quantityDelta === 0) throw new HttpError(400, 'bad_request', 'The change cannot be zero.');
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, input.quantityDelta > 0);
  const line = await lineOf(manager, shopId, input, ctx.at);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  if (pool.method === 'specific' && pool.quantity > 0) throw stockConflict('serialised', `${part.number} is tracked by serial number: issue or return the numbered item instead.`);
  if (input.quantityDelta < 0) requireFree(line, -input.quantityDelta, part);
  const valueChange = averageValueChange(pool, { kind: 'adjustment', quantityDelta: input.quantityDelta, ...(input.quantityDelta > 0 && input.unitCostMinor !== undefined ? { unitCost: input.unitCostMinor } : {}) });
  pool.method = 'average';
  const movement = await appendMovement(
    manager,
    shopId,
    { kind: 'adjusted', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: input.quantityDelta, countedQuantity: null, unitCostMinor: input.quantityDelta > 0 ? (input.unitCostMinor ?? null) : null, valueChangeMinor: valueChange, serialId: null, reason: input.reason, holdId: null },
    input,
    ctx,
  );
  line.onHand += input.quantityDelta;
  line.updatedAt = ctx.at;
  pool.quantity += input.quantityDelta;
  pool.valueMinor += valueChange;
  pool.updatedAt = ctx.at;
  await saveLine(manager, line);
  await savePool(manager, pool);
  await audit(manager, shopId, ctx, 'stock.adjusted', 'part', part.id, { bin: input.binId, condition: input.condition, quantityDelta: input.quantityDelta, reason: input.reason, movement: movement.id });
  return [movement];
}

/** Stock moved from one bin to another; condition and value stay. */
export interface MoveStock extends MovementLabels {
  partId: string;
  condition: StockCondition;
  fromBinId: string;
  toBinId: string;
  quantity: number;
  serial?: string;
}

/** Moves free stock between bins (held stock stays where its hold says). One `moved` movement. */
export async function moveStock(manager: EntityManager, shopId: string, input: MoveStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.fromBinId, false);
  const to = await binOf(manager, shopId, input.toBinId, true);
  if (input.fromBinId === input.toBinId) throw new HttpError(400, 'bad_request', 'Choose a different bin to move to.');
  const from = await lineOf(manager, shopId, { partId: input.partId, binId: input.fromBinId, condition: input.condition }, ctx.at);
  const dest = await lineOf(manager, shopId, { partId: input.partId, binId: input.toBinId, condition: input.condition }, ctx.at);
  requireFree(from, input.quantity, part);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  let serialId: string | null = null;
  if (pool.method === 'specific' && pool.quantity > 0) {
    if (input.quantity !== 1) throw stockConflict('serial_one_at_a_time', `${part.number} is tracked by serial number: move one item at a time.`);
    const item = await serialInStock(manager, shopId, part.id, input.serial, { binId: input.fromBinId, condition: input.condition }, part);
    await manager.update(SerialEntity, { id: item.id }, { binId: to.id });
    serialId = item.id;
  }
  const movement = await appendMovement(
    manager,
    shopId,
    { kind: 'moved', partId: part.id, binId: input.fromBinId, toBinId: input.toBinId, condition: input.condition, quantityDelta: -input.quantity, countedQuantity: null, unitCostMinor: null, valueChangeMinor: 0, serialId, reason: null, holdId: null },
    input,
    ctx,
  );
  from.onHand -= input.quantity;
  from.updatedAt = ctx.at;
  dest.onHand += input.quantity;
  dest.updatedAt = ctx.at;
  await saveLine(manager, from);
  await saveLine(manager, dest);
  await audit(manager, shopId, ctx, 'stock.moved', 'part', part.id, { fromBin: input.fromBinId, toBin: input.toBinId, condition: input.condition, quantity: input.quantity, serial: input.serial, movement: movement.id });
  return [movement];
}

/** A stock count of one line. */
export interface CountStock extends LineRef, MovementLabels {
  countedQuantity: number;
  /** Cost of units found when nothing was on hand to take an average from. */
  unitCostMinor?: number;
}

/**
 * Records a count: one `counted` movement whose delta is the variance (zero confirms the balance).
 * A count below what is held is refused (release holds first); a serialised line with a variance
 * is refused (find or issue the numbered items instead).
 */
export async function countStock(manager: EntityManager, shopId: string, input: CountStock, ctx: StockWriteContext): Promise<MovementRow[]> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, false);
  const line = await lineOf(manager, shopId, input, ctx.at);
  const pool = await poolOf(manager, shopId, input.partId, input.condition, ctx.at);
  const delta = input.countedQuantity - line.onHand;
  if (input.countedQuantity < line.held) throw stockConflict('count_below_held', `${line.held} are held in that bin: release holds before counting fewer.`, { held: line.held });
  let valueChange = 0;
  if (delta !== 0) {
    if (pool.method === 'specific' && pool.quantity > 0) throw stockConflict('serialised', `${part.number} is tracked by serial number: issue or return the numbered items instead.`);
    valueChange = averageValueChange(pool, { kind: 'adjustment', quantityDelta: delta, ...(delta > 0 && input.unitCostMinor !== undefined ? { unitCost: input.unitCostMinor } : {}) });
    pool.method = pool.quantity === 0 ? 'average' : pool.method;
  }
  const movement = await appendMovement(
    manager,
    shopId,
    { kind: 'counted', partId: part.id, binId: input.binId, toBinId: null, condition: input.condition, quantityDelta: delta, countedQuantity: input.countedQuantity, unitCostMinor: delta > 0 ? (input.unitCostMinor ?? null) : null, valueChangeMinor: valueChange, serialId: null, reason: null, holdId: null },
    input,
    ctx,
  );
  line.onHand = input.countedQuantity;
  line.updatedAt = ctx.at;
  pool.quantity += delta;
  pool.valueMinor += valueChange;
  pool.updatedAt = ctx.at;
  await saveLine(manager, line);
  if (delta !== 0 || !pool.isNew) await savePool(manager, pool);
  await audit(manager, shopId, ctx, 'stock.counted', 'part', part.id, { bin: input.binId, condition: input.condition, countedQuantity: input.countedQuantity, variance: delta, movement: movement.id });
  return [movement];
}

/** Stock to set aside: a named purpose now, a job once jobs exist. */
export interface HoldStock extends LineRef {
  quantity: number;
  purpose: string;
  jobId?: string | null;
}

/**
 * Sets free stock aside. Free = on hand − held, never below zero: asking for more than is free is
 * a 409 (`insufficient_free_stock`), also when many requests arrive at once (writes are serialised
 * by the write lock and the check runs inside the transaction; the table's CHECK backs it up).
 */
export async function holdStock(manager: EntityManager, shopId: string, input: HoldStock, ctx: StockWriteContext): Promise<HoldRow> {
  const part = await partOf(manager, shopId, input.partId);
  await binOf(manager, shopId, input.binId, false);
  const line = await lineOf(manager, shopId, input, ctx.at);
  requireFree(line, input.quantity, part);
  const hold: HoldRow = { id: randomUUID(), shopId, partId: part.id, binId: input.binId, condition: input.condition, quantity: input.quantity, purpose: input.purpose, jobId: input.jobId ?? null, status: 'active', createdByUserId: ctx.actor.userId, createdAt: ctx.at, closedAt: null };
  await manager.insert(HoldEntity, hold);
  line.held += input.quantity;
  line.updatedAt = ctx.at;
  await saveLine(manager, line);
  await audit(manager, shopId, ctx, 'stock.held', 'stock_hold', hold.id, { part: part.id, bin: input.binId, condition: input.condition, quantity: input.quantity, purpose: input.purpose, job: input.jobId });
  return hold;
}

/** Releases an active hold: its stock becomes free again. A hold already closed is a 409. */
export async function releaseHold(manager: EntityManager, shopId: string, holdId: string, ctx: StockWriteContext): Promise<HoldRow> {
  const hold = await shopScoped(manager, HoldEntity, shopId).findOne({ id: holdId });
  if (!hold) throw notFound('No such hold in this shop.');
  if (hold.status !== 'active') throw stockConflict('hold_closed', `That hold was already ${hold.status}.`);
  const line = await lineOf(manager, shopId, hold, ctx.at);
  line.held -= hold.quantity;
  line.updatedAt = ctx.at;
  await saveLine(manager, line);
  await manager.update(HoldEntity, { id: hold.id }, { status: 'released', closedAt: ctx.at });
  await audit(manager, shopId, ctx, 'stock.hold_released', 'stock_hold', hold.id, { quantity: hold.quantity });
  return { ...hold, status: 'released', closedAt: ctx.at };
}

/** Creates a bin; a code already used in the shop (any case) is a 409. */
export async function createBin(manager: EntityManager, shopId: string, input: { code: string; description?: string | null }, ctx: StockWriteContext): Promise<BinRow> {
  const codeKey = input.code.trim().toUpperCase();
  if (await shopScoped(manager, BinEntity, shopId).findOne({ codeKey })) throw new HttpError(409, 'conflict', `There is already a bin ${input.code}.`);
  const bin: BinRow = { id: randomUUID(), shopId, code: input.code.trim(), codeKey, description: input.description ?? null, active: true, createdAt: ctx.at, updatedAt: ctx.at };
  await manager.insert(BinEntity, bin);
  await audit(manager, shopId, ctx, 'bin.created', 'stock_bin', bin.id, { code: bin.code, description: bin.description });
  return bin;
}

/** Changes a bin's code, description or whether it is in use; a bin with stock on hand stays in use. */
export async function updateBin(manager: EntityManager, shopId: string, binId: string, patch: BinUpdate, ctx: StockWriteContext): Promise<BinRow> {
  const bin = await binOf(manager, shopId, binId, false);
  const next: Partial<BinRow> = {};
  if (patch.code !== undefined && patch.code.trim() !== bin.code) {
    const codeKey = patch.code.trim().toUpperCase();
    const clash = await shopScoped(manager, BinEntity, shopId).findOne({ codeKey });
    if (clash && clash.id !== bin.id) throw new HttpError(409, 'conflict', `There is already a bin ${patch.code}.`);
    Object.assign(next, { code: patch.code.trim(), codeKey });
  }
  if (patch.description !== undefined) next.description = patch.description ?? null;
  if (patch.active !== undefined && patch.active !== bin.active) {
    if (!patch.active) {
      const [row] = await manager.query<Array<{ n: number }>>(`SELECT COALESCE(SUM(on_hand), 0) AS n FROM stock_lines WHERE shop_id = ? AND bin_id = ?`, [shopId, bin.id]);
      if (Number(row?.n ?? 0) > 0) throw stockConflict('bin_not_empty', `Bin ${bin.code} still has stock: move it out first.`);
    }
    next.active = patch.active;
  }
  if (Object.keys(next).length === 0) return bin;
  await manager.update(BinEntity, { id: bin.id }, { ...next, updatedAt: ctx.at });
  const changes = Object.fromEntries(Object.entries(next).filter(([k]) => k !== 'codeKey').map(([k, v]) => [k, { before: bin[k as keyof BinRow], after: v }]));
  await recordAudit(manager, { shopId, actor: ctx.actor, action: 'bin.updated', entity: 'stock_bin', entityId: bin.id, changes, at: ctx.at });
  return { ...bin, ...next, updatedAt: ctx.at };
}

/** The movement kinds, for callers that switch on them. */
export type { MovementKind };
/** Input of {@link createBin}, as the contract defines it. */
export type { BinInput };

/** A bin as the API shows it (quantities filled in by the queries). */
function binView(bin: BinRow, onHand = 0, lineCount = 0): Bin {
  return { id: bin.id, code: bin.code, description: bin.description, active: bin.active, onHand, lineCount };
}

/**
 * The stock module's HTTP-facing service: each write takes the write lock once and calls the
 * internal functions above; reads go through stock.queries.ts.
 */
export function createStockService(deps: { db: Database; clock: Clock; graphOf: (shopId: string) => Promise<LineageGraph> }) {
  const { db, clock } = deps;
  const ctxOf = (actor: AuditActor): StockWriteContext => ({ actor, at: clock.now() });

  async function written(shopId: string, work: (manager: EntityManager, ctx: StockWriteContext) => Promise<MovementRow[]>, actor: AuditActor): Promise<MovementWriteResponse> {
    const rows = await db.write((manager) => work(manager, ctxOf(actor)));
    const { movements } = await listMovements(db.reader, shopId, { ids: rows.map((r) => r.id), page: 1, pageSize: rows.length || 1 });
    return { movements };
  }

  async function holdView(shopId: string, id: string): Promise<Hold> {
    const [hold] = await listHolds(db.reader, shopId, { ids: [id] });
    if (!hold) throw notFound('No such hold in this shop.');
    return hold;
  }

  return {
    bins: (shopId: string) => listBins(db.reader, shopId),
    async createBin(shopId: string, input: z.output<typeof binInputSchema>, actor: AuditActor): Promise<Bin> {
      return binView(await db.write((manager) => createBin(manager, shopId, input, ctxOf(actor))));
    },
    async updateBin(shopId: string, binId: string, patch: z.output<typeof binUpdateSchema>, actor: AuditActor): Promise<Bin> {
      const bin = await db.write((manager) => updateBin(manager, shopId, binId, patch, ctxOf(actor)));
      return (await listBins(db.reader, shopId)).find((b) => b.id === bin.id) ?? binView(bin);
    },
    list: (shopId: string, query: StockListFilters) => listStock(db.reader, shopId, query),
    movements: (shopId: string, query: MovementFilters) => listMovements(db.reader, shopId, query),
    /** One page of a status's holds, with how many there are in all. */
    async holds(shopId: string, query: { partId?: string; status: 'active' | 'released' | 'issued'; page: number; pageSize: number }) {
      const { page, pageSize, ...filters } = query;
      const [holds, total] = await Promise.all([listHolds(db.reader, shopId, filters, { limit: pageSize, offset: (page - 1) * pageSize }), countHolds(db.reader, shopId, filters)]);
      return { holds, total, page, pageSize };
    },

    receive: (shopId: string, input: ReceiveStock, actor: AuditActor) => written(shopId, (m, ctx) => receiveStock(m, shopId, input, ctx), actor),
    issue: (shopId: string, input: IssueStock, actor: AuditActor) => written(shopId, (m, ctx) => issueStock(m, shopId, input, ctx), actor),
    returnToStock: (shopId: string, input: ReturnStock, actor: AuditActor) => written(shopId, (m, ctx) => returnStock(m, shopId, input, ctx), actor),
    adjust: (shopId: string, input: AdjustStock, actor: AuditActor) => written(shopId, (m, ctx) => adjustStock(m, shopId, input, ctx), actor),
    move: (shopId: string, input: MoveStock, actor: AuditActor) => written(shopId, (m, ctx) => moveStock(m, shopId, input, ctx), actor),
    count: (shopId: string, input: CountStock, actor: AuditActor) => written(shopId, (m, ctx) => countStock(m, shopId, input, ctx), actor),
    async hold(shopId: string, input: HoldStock, actor: AuditActor): Promise<Hold> {
      const hold = await db.write((manager) => holdStock(manager, shopId, input, ctxOf(actor)));
      return holdView(shopId, hold.id);
    },
    async release(shopId: string, holdId: string, actor: AuditActor): Promise<Hold> {
      await db.write((manager) => releaseHold(manager, shopId, holdId, ctxOf(actor)));
      return holdView(shopId, holdId);
    },

    /** A part's stock, holds, serialised items, valuation and every fill option's free stock. */
    async partStock(shopId: string, partId: string): Promise<PartStockResponse> {
      const part = await shopScoped(db.reader, PartEntity, shopId).findOneOr404({ id: partId }, 'No such part in this shop.');
      const graph = await deps.graphOf(shopId);
      const options = graph.hasPart(part.id) ? graph.canFill(part.id, { maxOptions: 20 }).options.filter((o) => o.via.length > 0) : [];
      const otherIds = [...new Set(options.flatMap((o) => o.parts.map((p) => p.partId)))];
      const stock = await freeStockByPart(db.reader, shopId, [part.id, ...otherIds]);
      const others = otherIds.length ? await db.reader.query<Array<{ id: string; description: string }>>(`SELECT id, description FROM parts WHERE shop_id = ? AND id IN (${otherIds.map(() => '?').join(', ')})`, [shopId, ...otherIds]) : [];
      const descriptions = new Map(others.map((o) => [o.id, o.description]));
      const serials = await db.reader.query<Array<{ id: string; serial: string; binId: string | null; binCode: string | null; condition: StockCondition; costMinor: number; inStock: number; receivedAt: string }>>(
        `SELECT s.id, s.serial, s.bin_id AS binId, b.code AS binCode, s.condition, s.cost_minor AS costMinor, s.in_stock AS inStock, s.received_at AS receivedAt
         FROM stock_serials s LEFT JOIN stock_bins b ON b.shop_id = s.shop_id AND b.id = s.bin_id WHERE s.shop_id = ? AND s.part_id = ? ORDER BY s.in_stock DESC, s.received_at DESC LIMIT 200`,
        [shopId, part.id],
      );
      const pools = await shopScoped(db.reader, StockPoolEntity, shopId).find({ partId: part.id });
      return {
        partId: part.id,
        number: part.number,
        stock: stock.get(part.id)!,
        holds: await listHolds(db.reader, shopId, { partId: part.id, status: 'active' }),
        serials: serials.map((s) => ({ ...s, inStock: Boolean(s.inStock), receivedAt: isoOf(s.receivedAt) })),
        valuation: pools
          .filter((p) => p.quantity > 0)
          .map((p) => ({ condition: p.condition, method: p.method, quantity: p.quantity, valueMinor: p.valueMinor, unitCostMinor: p.method === 'average' ? closingPosition([], { quantity: p.quantity, value: p.valueMinor }).unitCost : null })),
        fillOptions: options.map((o) => ({
          via: o.via,
          needsChanges: o.needsChanges,
          parts: o.parts.map((p) => ({ partId: p.partId, number: p.number, description: descriptions.get(p.partId) ?? '', quantity: p.quantity, stock: stock.get(p.partId)! })),
        })),
        currency: await currencyOf(db.reader, shopId),
      };
    },

    valuation: (shopId: string) => valuationReport(db.reader, shopId),
    valuationCsv: (shopId: string) => valuationCsv(db.reader, shopId),
    history: (shopId: string, months: number) => valueHistory(db.reader, shopId, months, clock.now()),
  };
}

export type StockService = ReturnType<typeof createStockService>;
