import type { EntityManager } from 'typeorm';
import { defaultShopSettings, type Bin, type Hold, type Movement, type MovementKind, type StockCondition, type StockLine, type StockSummary, type ValuationReport, type ValueHistory } from '@tappet/contracts';
import { formatMinorUnits } from '@tappet/domain';
import { csvLine } from '../audit/csv';

// Reads of the stock ledger. Every query carries the shop filter itself. Functions take a reader
// (db.reader, or the manager of a write when called inside one) so other modules can use them.

/** SQLite datetime text (UTC, as TypeORM writes it) or a Date, as ISO 8601. */
export function isoOf(value: string | Date): string {
  if (value instanceof Date) return value.toISOString();
  return new Date(value.includes('T') ? value : `${value.replace(' ', 'T')}Z`).toISOString();
}

const marks = (n: number) => Array.from({ length: n }, () => '?').join(', ');
const emptySummary = (): StockSummary => ({ onHand: 0, held: 0, free: 0, lines: [] });

/**
 * Stock of each part: on hand, held and free in total and per bin and condition (lines with
 * nothing on hand left out). Parts without stock get zeros. Free = on hand − held, never below zero.
 */
export async function freeStockByPart(reader: EntityManager, shopId: string, partIds: readonly string[]): Promise<Map<string, StockSummary>> {
  const out = new Map<string, StockSummary>(partIds.map((id) => [id, emptySummary()]));
  const ids = [...new Set(partIds)];
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    const rows = await reader.query<Array<{ partId: string; binId: string; binCode: string; condition: StockCondition; onHand: number; held: number }>>(
      `SELECT l.part_id AS partId, l.bin_id AS binId, b.code AS binCode, l.condition, l.on_hand AS onHand, l.held
       FROM stock_lines l JOIN stock_bins b ON b.shop_id = l.shop_id AND b.id = l.bin_id
       WHERE l.shop_id = ? AND l.part_id IN (${marks(chunk.length)}) AND l.on_hand > 0
       ORDER BY b.code_key, l.condition`,
      [shopId, ...chunk],
    );
    for (const r of rows) {
      const summary = out.get(r.partId)!;
      const free = Math.max(0, r.onHand - r.held);
      summary.lines.push({ binId: r.binId, binCode: r.binCode, condition: r.condition, onHand: r.onHand, held: r.held, free });
      summary.onHand += r.onHand;
      summary.held += r.held;
      summary.free += free;
    }
  }
  return out;
}

/**
 * Free stock of every part of the shop that has some, cores left out (they are not sellable):
 * one grouped scan of the shop's stock lines. For whole-shop work such as the reorder list, where
 * freeStockByPart's id lists would re-read the lines chunk by chunk.
 */
export async function freeSellableStockOfShop(reader: EntityManager, shopId: string): Promise<Map<string, number>> {
  // Lines held in full add nothing, so only lines with something free are summed.
  const rows = await reader.query<Array<{ partId: string; free: number }>>(
    `SELECT part_id AS partId, SUM(on_hand - held) AS free FROM stock_lines
     WHERE shop_id = ? AND on_hand > held AND condition <> 'core' GROUP BY part_id`,
    [shopId],
  );
  return new Map(rows.map((r) => [r.partId, Number(r.free)]));
}

/** The shop's currency (settings, or the default). */
export async function currencyOf(reader: EntityManager, shopId: string): Promise<string> {
  const [row] = await reader.query<Array<{ currency: string }>>(`SELECT currency FROM shop_settings WHERE shop_id = ?`, [shopId]);
  return row?.currency ?? defaultShopSettings.currency;
}

/** Every bin of the shop with what it holds. */
export async function listBins(reader: EntityManager, shopId: string): Promise<Bin[]> {
  const rows = await reader.query<Array<{ id: string; code: string; description: string | null; active: number; onHand: number; lineCount: number }>>(
    `SELECT b.id, b.code, b.description, b.active,
       COALESCE((SELECT SUM(l.on_hand) FROM stock_lines l WHERE l.shop_id = b.shop_id AND l.bin_id = b.id), 0) AS onHand,
       (SELECT COUNT(*) FROM stock_lines l WHERE l.shop_id = b.shop_id AND l.bin_id = b.id AND l.on_hand > 0) AS lineCount
     FROM stock_bins b WHERE b.shop_id = ? ORDER BY b.code_key`,
    [shopId],
  );
  return rows.map((r) => ({ id: r.id, code: r.code, description: r.description, active: Boolean(r.active), onHand: Number(r.onHand), lineCount: Number(r.lineCount) }));
}

export interface StockListFilters {
  q?: string;
  partId?: string;
  binId?: string;
  condition?: StockCondition;
  includeEmpty: boolean;
  page: number;
  pageSize: number;
}

/** Stock lines with their part and bin, by part number then bin. */
export async function listStock(reader: EntityManager, shopId: string, filters: StockListFilters): Promise<{ lines: StockLine[]; total: number }> {
  const where = ['l.shop_id = ?'];
  const params: unknown[] = [shopId];
  const add = (sql: string, ...values: unknown[]) => {
    where.push(sql);
    params.push(...values);
  };
  if (!filters.includeEmpty) where.push('l.on_hand > 0');
  if (filters.partId) add('l.part_id = ?', filters.partId);
  if (filters.binId) add('l.bin_id = ?', filters.binId);
  if (filters.condition) add('l.condition = ?', filters.condition);
  if (filters.q) {
    // Number (normalised) or description words, as typed.
    where.push(`(p.key LIKE ? ESCAPE '\\' OR p.description LIKE ? ESCAPE '\\' OR b.code LIKE ? ESCAPE '\\')`);
    const like = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    params.push(like(filters.q.toUpperCase().replace(/[^A-Z0-9]/g, '')), like(filters.q), like(filters.q));
  }
  const from = `FROM stock_lines l JOIN parts p ON p.shop_id = l.shop_id AND p.id = l.part_id JOIN stock_bins b ON b.shop_id = l.shop_id AND b.id = l.bin_id WHERE ${where.join(' AND ')}`;
  const [count] = await reader.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n ${from}`, params);
  const rows = await reader.query<Array<Omit<StockLine, 'free'>>>(
    `SELECT l.part_id AS partId, p.number AS partNumber, p.description AS partDescription, p.category, p.origin, l.bin_id AS binId, b.code AS binCode, l.condition, l.on_hand AS onHand, l.held
     ${from} ORDER BY p.key, b.code_key, l.condition LIMIT ? OFFSET ?`,
    [...params, filters.pageSize, (filters.page - 1) * filters.pageSize],
  );
  return { lines: rows.map((r) => ({ ...r, free: Math.max(0, r.onHand - r.held) })), total: Number(count?.n ?? 0) };
}

export interface MovementFilters {
  partId?: string;
  binId?: string;
  kind?: MovementKind;
  condition?: StockCondition;
  from?: string;
  to?: string;
  page: number;
  pageSize: number;
  ids?: string[];
}

type MovementSqlRow = Omit<Movement, 'occurredAt'> & { occurredAt: string };

/** Movements newest first (or exactly `ids`), with part, bins and who recorded them. */
export async function listMovements(reader: EntityManager, shopId: string, filters: MovementFilters): Promise<{ movements: Movement[]; total: number }> {
  const where = ['m.shop_id = ?'];
  const params: unknown[] = [shopId];
  const add = (sql: string, ...values: unknown[]) => {
    where.push(sql);
    params.push(...values);
  };
  if (filters.ids) add(`m.id IN (${marks(filters.ids.length || 1)})`, ...(filters.ids.length ? filters.ids : ['']));
  if (filters.partId) add('m.part_id = ?', filters.partId);
  if (filters.binId) add('(m.bin_id = ? OR m.to_bin_id = ?)', filters.binId, filters.binId);
  if (filters.kind) add('m.kind = ?', filters.kind);
  if (filters.condition) add('m.condition = ?', filters.condition);
  if (filters.from) add('m.occurred_at >= ?', filters.from);
  // A date includes that whole day: everything before the next day's first instant.
  if (filters.to) add(`m.occurred_at < ?`, new Date(Date.parse(`${filters.to}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10));
  const from = `FROM stock_movements m WHERE ${where.join(' AND ')}`;
  const [count] = await reader.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n ${from}`, params);
  const rows = await reader.query<MovementSqlRow[]>(
    `SELECT m.id, m.seq, m.kind, m.part_id AS partId, p.number AS partNumber, p.description AS partDescription,
       m.bin_id AS binId, b.code AS binCode, m.to_bin_id AS toBinId, tb.code AS toBinCode, m.condition,
       m.quantity_delta AS quantityDelta, m.counted_quantity AS countedQuantity, m.unit_cost_minor AS unitCostMinor,
       m.value_change_minor AS valueChangeMinor, s.serial, m.reason, m.reference, m.note, m.hold_id AS holdId, m.job_id AS jobId,
       m.occurred_at AS occurredAt, u.name AS userName
     FROM (SELECT * ${from} ORDER BY seq DESC LIMIT ? OFFSET ?) m
     JOIN parts p ON p.shop_id = m.shop_id AND p.id = m.part_id
     JOIN stock_bins b ON b.shop_id = m.shop_id AND b.id = m.bin_id
     LEFT JOIN stock_bins tb ON tb.shop_id = m.shop_id AND tb.id = m.to_bin_id
     LEFT JOIN stock_serials s ON s.shop_id = m.shop_id AND s.id = m.serial_id
     LEFT JOIN users u ON u.id = m.user_id
     ORDER BY m.seq DESC`,
    [...params, filters.pageSize, (filters.page - 1) * filters.pageSize],
  );
  return { movements: rows.map((r) => ({ ...r, occurredAt: isoOf(r.occurredAt) })), total: Number(count?.n ?? 0) };
}

/** Holds of the shop (active ones by default), oldest first. */
type HoldFilters = { partId?: string; status?: 'active' | 'released' | 'issued'; ids?: string[] };

/**
 * Holds matching the filters: active ones oldest first (the longest waiting on top), closed ones
 * newest first. Every match unless `window` asks for one page of them.
 */
export async function listHolds(reader: EntityManager, shopId: string, filters: HoldFilters, window?: { limit: number; offset: number }): Promise<Hold[]> {
  const { where, params } = holdWhere(shopId, filters);
  const order = filters.status && filters.status !== 'active' ? 'h.closed_at DESC, h.id DESC' : 'h.created_at, h.id';
  const rows = await reader.query<Array<Omit<Hold, 'createdAt' | 'closedAt'> & { createdAt: string; closedAt: string | null }>>(
    `SELECT h.id, h.part_id AS partId, p.number AS partNumber, p.description AS partDescription, h.bin_id AS binId, b.code AS binCode, h.condition,
       h.quantity, h.purpose, h.job_id AS jobId, h.status, h.created_at AS createdAt, u.name AS createdByName, h.closed_at AS closedAt
     FROM stock_holds h
     JOIN parts p ON p.shop_id = h.shop_id AND p.id = h.part_id
     JOIN stock_bins b ON b.shop_id = h.shop_id AND b.id = h.bin_id
     LEFT JOIN users u ON u.id = h.created_by_user_id
     WHERE ${where.join(' AND ')} ORDER BY ${order}${window ? ' LIMIT ? OFFSET ?' : ''}`,
    window ? [...params, window.limit, window.offset] : params,
  );
  return rows.map((r) => ({ ...r, createdAt: isoOf(r.createdAt), closedAt: r.closedAt ? isoOf(r.closedAt) : null }));
}

/** How many holds match the filters. */
export async function countHolds(reader: EntityManager, shopId: string, filters: HoldFilters): Promise<number> {
  const { where, params } = holdWhere(shopId, filters);
  const [row] = await reader.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM stock_holds h WHERE ${where.join(' AND ')}`, params);
  return Number(row?.n ?? 0);
}

function holdWhere(shopId: string, filters: HoldFilters): { where: string[]; params: unknown[] } {
  const where = ['h.shop_id = ?'];
  const params: unknown[] = [shopId];
  const add = (sql: string, ...values: unknown[]) => {
    where.push(sql);
    params.push(...values);
  };
  if (filters.ids) add(`h.id IN (${marks(filters.ids.length || 1)})`, ...(filters.ids.length ? filters.ids : ['']));
  if (filters.partId) add('h.part_id = ?', filters.partId);
  if (filters.status) add('h.status = ?', filters.status);
  return { where, params };
}

/**
 * Splits `total` over `weights` in proportion, in whole minor units that add up to `total`
 * exactly (largest remainder; ties to the earlier weight). Used to show an average pool's value
 * per bin without creating or losing a penny.
 */
export function apportion(total: number, weights: readonly number[]): number[] {
  const sum = weights.reduce((a, b) => a + b, 0);
  if (sum === 0) return weights.map(() => 0);
  const exact = weights.map((w) => (BigInt(total) * BigInt(w)) / BigInt(sum));
  const shares = exact.map(Number);
  const remainders = weights.map((w, i) => ({ i, r: (BigInt(total) * BigInt(w)) % BigInt(sum) }));
  let left = total - shares.reduce((a, b) => a + b, 0);
  remainders.sort((a, b) => (a.r === b.r ? a.i - b.i : a.r > b.r ? -1 : 1));
  for (const { i } of remainders) {
    if (left <= 0) break;
    shares[i]! += 1;
    left -= 1;
  }
  return shares;
}

/** A stock line with its share of its pool's value. */
export interface ValuedLine {
  partId: string;
  partNumber: string;
  partDescription: string;
  category: string | null;
  origin: string;
  binCode: string;
  condition: StockCondition;
  method: 'average' | 'specific';
  onHand: number;
  held: number;
  valueMinor: number;
}

/**
 * Every line with something on hand and its value: average pools apportioned over their bins by
 * quantity (the shares add up to the pool's value), serialised items at their own costs.
 */
export async function valuedLines(reader: EntityManager, shopId: string): Promise<ValuedLine[]> {
  const lines = await reader.query<Array<Omit<ValuedLine, 'valueMinor' | 'method'> & { binId: string; poolValue: number; method: 'average' | 'specific' }>>(
    `SELECT l.part_id AS partId, p.number AS partNumber, p.description AS partDescription, p.category, p.origin, l.bin_id AS binId, b.code AS binCode,
       l.condition, l.on_hand AS onHand, l.held, sp.value_minor AS poolValue, sp.method
     FROM stock_lines l
     JOIN parts p ON p.shop_id = l.shop_id AND p.id = l.part_id
     JOIN stock_bins b ON b.shop_id = l.shop_id AND b.id = l.bin_id
     JOIN stock_pools sp ON sp.shop_id = l.shop_id AND sp.part_id = l.part_id AND sp.condition = l.condition
     WHERE l.shop_id = ? AND l.on_hand > 0
     ORDER BY p.key, l.condition, b.code_key`,
    [shopId],
  );
  const serialValues = new Map<string, number>();
  for (const r of await reader.query<Array<{ partId: string; binId: string; condition: string; value: number }>>(
    `SELECT part_id AS partId, bin_id AS binId, condition, SUM(cost_minor) AS value FROM stock_serials WHERE shop_id = ? AND in_stock = 1 GROUP BY part_id, bin_id, condition`,
    [shopId],
  )) {
    serialValues.set(`${r.partId}|${r.binId}|${r.condition}`, Number(r.value));
  }
  const pools = new Map<string, typeof lines>();
  for (const line of lines) {
    const key = `${line.partId}|${line.condition}`;
    pools.set(key, [...(pools.get(key) ?? []), line]);
  }
  const out: ValuedLine[] = [];
  for (const group of pools.values()) {
    const first = group[0]!;
    const shares = first.method === 'specific' ? group.map((l) => serialValues.get(`${l.partId}|${l.binId}|${l.condition}`) ?? 0) : apportion(Number(first.poolValue), group.map((l) => l.onHand));
    group.forEach((l, i) => {
      const { binId: _binId, poolValue: _poolValue, ...rest } = l;
      out.push({ ...rest, valueMinor: shares[i]! });
    });
  }
  return out;
}

/** Stock value by category, origin, condition and bin, largest first. */
export async function valuationReport(reader: EntityManager, shopId: string): Promise<ValuationReport> {
  const lines = await valuedLines(reader, shopId);
  const group = (keyOf: (l: ValuedLine) => string) => {
    const map = new Map<string, { key: string; quantity: number; valueMinor: number }>();
    for (const l of lines) {
      const key = keyOf(l);
      const g = map.get(key) ?? { key, quantity: 0, valueMinor: 0 };
      g.quantity += l.onHand;
      g.valueMinor += l.valueMinor;
      map.set(key, g);
    }
    return [...map.values()].sort((a, b) => b.valueMinor - a.valueMinor || a.key.localeCompare(b.key));
  };
  return {
    currency: await currencyOf(reader, shopId),
    totalMinor: lines.reduce((s, l) => s + l.valueMinor, 0),
    totalQuantity: lines.reduce((s, l) => s + l.onHand, 0),
    byCategory: group((l) => l.category ?? 'Uncategorised'),
    byOrigin: group((l) => l.origin),
    byCondition: group((l) => l.condition),
    byBin: group((l) => l.binCode),
  };
}

/** The stock value as CSV, one record per line (part × bin × condition). */
export async function valuationCsv(reader: EntityManager, shopId: string): Promise<string> {
  const currency = await currencyOf(reader, shopId);
  const lines = await valuedLines(reader, shopId);
  const head = csvLine(['part number', 'description', 'category', 'origin', 'condition', 'bin', 'on hand', 'held', 'valuation', `value (${currency})`]);
  return head + lines.map((l) => csvLine([l.partNumber, l.partDescription, l.category ?? '', l.origin, l.condition, l.binCode, l.onHand, l.held, l.method === 'specific' ? 'specific identification' : 'moving average', formatMinorUnits(l.valueMinor)])).join('');
}

/**
 * Stock value at the end of each of the last `months` months and today, from the ledger: the
 * running sum of every movement's value change up to that instant.
 */
export async function valueHistory(reader: EntityManager, shopId: string, months: number, today: Date): Promise<ValueHistory> {
  const byMonth = await reader.query<Array<{ month: string; change: number }>>(
    `SELECT substr(occurred_at, 1, 7) AS month, SUM(value_change_minor) AS change FROM stock_movements WHERE shop_id = ? GROUP BY month ORDER BY month`,
    [shopId],
  );
  const monthEnds: string[] = [];
  for (let i = months - 1; i >= 1; i--) {
    const end = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth() - i + 1, 0));
    monthEnds.push(end.toISOString().slice(0, 10));
  }
  const points: ValueHistory['points'] = [];
  let running = 0;
  let index = 0;
  for (const date of monthEnds) {
    while (index < byMonth.length && byMonth[index]!.month <= date.slice(0, 7)) running += Number(byMonth[index++]!.change);
    points.push({ date, valueMinor: running });
  }
  while (index < byMonth.length) running += Number(byMonth[index++]!.change);
  points.push({ date: today.toISOString().slice(0, 10), valueMinor: running });
  return { currency: await currencyOf(reader, shopId), points };
}
