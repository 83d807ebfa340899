import { randomUUID } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import { maxCountLines, type AuditAction, type CountDetail, type CountEntryParsed, type CountLine, type CountStartParsed, type CountStatus, type CountSummary, type StockCondition, type VarianceLine, type VarianceReport } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { badRequest, notFound } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity } from '../catalogue/catalogue.entity';
import { BinEntity, StockLineEntity } from '../stock/stock.entity';
import { currencyOf, isoOf } from '../stock/stock.queries';
import { countStock, stockConflict, type StockWriteContext } from '../stock/stock.service';
import { StockCountEntity, StockCountLineEntity, type StockCountLineRow, type StockCountRow } from './counts.entity';

// Stock counts (issue 7). Starting a count freezes the expected quantity of every line in scope
// and remembers the ledger position (`freezeSeq`); stock keeps moving while people count. An entry
// records the counted quantity together with the net movements on that line since the freeze up
// to that moment (read under the write lock, so "the moment it was counted" is exact), so
//   variance = counted − (frozen + moved since the freeze, up to the entry).
// Posting applies each variance to the line as it stands then, through stock.service's countStock,
// in one transaction. See README.md.

const noSuchCount = () => notFound('No such stock count in this shop.');

interface Scope {
  binIds: string[];
  categories: string[];
}

const scopeOf = (count: StockCountRow): Scope => {
  const parsed = JSON.parse(count.scopeJson) as Partial<Scope>;
  return { binIds: parsed.binIds ?? [], categories: parsed.categories ?? [] };
};

/** Net change on hand of one line in movements after `afterSeq` (moves count on both sides). */
export async function netMovedSince(manager: EntityManager, shopId: string, line: { partId: string; binId: string; condition: string }, afterSeq: number): Promise<number> {
  const [row] = await manager.query<Array<{ net: number | null }>>(
    `SELECT SUM(CASE WHEN bin_id = ? THEN quantity_delta ELSE 0 END) + SUM(CASE WHEN to_bin_id = ? THEN -quantity_delta ELSE 0 END) AS net
     FROM stock_movements
     WHERE shop_id = ? AND part_id = ? AND condition = ? AND seq > ? AND (bin_id = ? OR to_bin_id = ?)`,
    [line.binId, line.binId, shopId, line.partId, line.condition, afterSeq, line.binId, line.binId],
  );
  return Number(row?.net ?? 0);
}

async function ledgerPosition(manager: EntityManager, shopId: string): Promise<number> {
  const [row] = await manager.query<Array<{ seq: number | null }>>(`SELECT MAX(seq) AS seq FROM stock_movements WHERE shop_id = ?`, [shopId]);
  return Number(row?.seq ?? 0);
}

const lineKey = (l: { partId: string; binId: string; condition: string }) => `${l.partId}|${l.binId}|${l.condition}`;

/** Lines (part × bin × condition) already in another open count of the shop. */
async function linesInOpenCounts(manager: EntityManager, shopId: string, exceptCountId: string | null): Promise<Map<string, number>> {
  const rows = await manager.query<Array<{ partId: string; binId: string; condition: string; number: number }>>(
    `SELECT l.part_id AS partId, l.bin_id AS binId, l.condition, c.number
     FROM stock_count_lines l JOIN stock_counts c ON c.shop_id = l.shop_id AND c.id = l.count_id
     WHERE l.shop_id = ? AND c.status = 'open' AND c.id <> ?`,
    [shopId, exceptCountId ?? ''],
  );
  return new Map(rows.map((r) => [lineKey(r), Number(r.number)]));
}

/** The variance of a counted line, or null while it is uncounted. */
export function varianceOf(line: Pick<StockCountLineRow, 'frozenQuantity' | 'countedQuantity' | 'movedSinceFreeze'>): number | null {
  if (line.countedQuantity === null) return null;
  return line.countedQuantity - (line.frozenQuantity + (line.movedSinceFreeze ?? 0));
}

/** Average unit cost (minor units, unrounded) of each part × condition pool, or null when empty. */
async function averageCosts(manager: EntityManager, shopId: string, partIds: string[]): Promise<Map<string, { method: string; unitCost: number | null }>> {
  const out = new Map<string, { method: string; unitCost: number | null }>();
  if (partIds.length === 0) return out;
  const ids = [...new Set(partIds)];
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    const pools = await manager.query<Array<{ partId: string; condition: string; method: string; quantity: number; valueMinor: number }>>(
      `SELECT part_id AS partId, condition, method, quantity, value_minor AS valueMinor FROM stock_pools WHERE shop_id = ? AND part_id IN (${chunk.map(() => '?').join(', ')})`,
      [shopId, ...chunk],
    );
    for (const p of pools) out.set(`${p.partId}|${p.condition}`, { method: p.method, unitCost: Number(p.quantity) > 0 ? Number(p.valueMinor) / Number(p.quantity) : null });
  }
  return out;
}

/** The last unit cost given for a part × condition (a receipt or costed return), for stock found when none is on hand. */
async function lastUnitCost(manager: EntityManager, shopId: string, partId: string, condition: string): Promise<number | null> {
  const [row] = await manager.query<Array<{ cost: number }>>(
    `SELECT unit_cost_minor AS cost FROM stock_movements WHERE shop_id = ? AND part_id = ? AND condition = ? AND unit_cost_minor IS NOT NULL ORDER BY seq DESC LIMIT 1`,
    [shopId, partId, condition],
  );
  return row ? Number(row.cost) : null;
}

async function countOf(manager: EntityManager, shopId: string, countId: string): Promise<StockCountRow> {
  const count = await shopScoped(manager, StockCountEntity, shopId).findOne({ id: countId });
  if (!count) throw noSuchCount();
  return count;
}

function requireOpen(count: StockCountRow): void {
  if (count.status !== 'open') throw stockConflict('count_closed', `Count ${count.number} was already ${count.status}.`, { status: count.status });
}

async function audit(manager: EntityManager, shopId: string, ctx: StockWriteContext, action: AuditAction, countId: string, changes: Record<string, { before: unknown; after: unknown }>): Promise<void> {
  await recordAudit(manager, { shopId, actor: ctx.actor, action, entity: 'stock_count', entityId: countId, changes, at: ctx.at });
}


/** Starts a count inside the caller's write (see the service's `start`); returns its id. */
export async function startCount(manager: EntityManager, shopId: string, input: CountStartParsed, ctx: StockWriteContext): Promise<string> {
  let lines: Array<{ partId: string; binId: string; condition: StockCondition; onHand: number }>;
  if (input.binIds.length > 0) {
    const bins = await shopScoped(manager, BinEntity, shopId).find({ id: In(input.binIds) });
    if (bins.length !== input.binIds.length) throw notFound('One of the chosen bins is not in this shop.');
    lines = (await shopScoped(manager, StockLineEntity, shopId).find({ binId: In(input.binIds) })).filter((l) => l.onHand > 0);
  } else {
    lines = await manager.query(
      `SELECT l.part_id AS partId, l.bin_id AS binId, l.condition, l.on_hand AS onHand
       FROM stock_lines l JOIN parts p ON p.shop_id = l.shop_id AND p.id = l.part_id
       WHERE l.shop_id = ? AND l.on_hand > 0 AND p.category IN (${input.categories.map(() => '?').join(', ')})`,
      [shopId, ...input.categories],
    );
    if (lines.length === 0) throw stockConflict('count_empty', 'Nothing of those categories is in stock: there is nothing to count.');
  }
  if (lines.length > maxCountLines) throw badRequest(`That would be ${lines.length} lines; count at most ${maxCountLines} at a time (choose fewer bins or categories).`);
  const busy = await linesInOpenCounts(manager, shopId, null);
  const clash = lines.find((l) => busy.has(lineKey(l)));
  if (clash) throw stockConflict('count_overlap', `Some of that stock is already being counted in count ${busy.get(lineKey(clash))}: finish or abandon it first.`, { count: busy.get(lineKey(clash)) });
  const [last] = await manager.query<Array<{ n: number | null }>>(`SELECT MAX(number) AS n FROM stock_counts WHERE shop_id = ?`, [shopId]);
  const count: StockCountRow = {
    id: randomUUID(),
    shopId,
    number: Number(last?.n ?? 0) + 1,
    status: 'open',
    scopeKind: input.binIds.length > 0 ? 'bins' : 'categories',
    scopeJson: JSON.stringify(input.binIds.length > 0 ? { binIds: input.binIds } : { categories: input.categories }),
    note: input.note || null,
    freezeSeq: await ledgerPosition(manager, shopId),
    startedAt: ctx.at,
    startedByUserId: ctx.actor.userId,
    closedAt: null,
    closedByUserId: null,
  };
  await manager.insert(StockCountEntity, count);
  const rows: StockCountLineRow[] = lines.map((l) => ({ id: randomUUID(), shopId, countId: count.id, partId: l.partId, binId: l.binId, condition: l.condition, frozenQuantity: Number(l.onHand), added: false, countedQuantity: null, movedSinceFreeze: null, countedAt: null, countedByUserId: null, postedMovementId: null }));
  for (let i = 0; i < rows.length; i += 100) await manager.insert(StockCountLineEntity, rows.slice(i, i + 100));
  await audit(manager, shopId, ctx, 'stock_count.started', count.id, {
    number: { before: null, after: count.number },
    scope: { before: null, after: input.binIds.length > 0 ? { binIds: input.binIds } : { categories: input.categories } },
    lines: { before: null, after: rows.length },
    freezeSeq: { before: null, after: count.freezeSeq },
    ...(count.note ? { note: { before: null, after: count.note } } : {}),
  });
  return count.id;
}

/** Records one entry inside the caller's write (see the service's `enter`); returns the line id. */
export async function enterCount(manager: EntityManager, shopId: string, countId: string, input: CountEntryParsed, ctx: StockWriteContext): Promise<string> {
  const count = await countOf(manager, shopId, countId);
  requireOpen(count);
  let line: StockCountLineRow | null;
  if (input.lineId) {
    line = await shopScoped(manager, StockCountLineEntity, shopId).findOne({ id: input.lineId, countId });
    if (!line) throw notFound('No such line in this count.');
  } else {
    const ref = { partId: input.partId!, binId: input.binId!, condition: input.condition! };
    line = await shopScoped(manager, StockCountLineEntity, shopId).findOne({ countId, ...ref });
    if (!line) {
      const part = await shopScoped(manager, PartEntity, shopId).findOne({ id: ref.partId });
      if (!part) throw notFound('No such part in this shop.');
      const bin = await shopScoped(manager, BinEntity, shopId).findOne({ id: ref.binId });
      if (!bin) throw notFound('No such bin in this shop.');
      const scope = scopeOf(count);
      const inScope = count.scopeKind === 'bins' ? scope.binIds.includes(bin.id) : part.category !== null && scope.categories.includes(part.category);
      if (!inScope) throw stockConflict('count_out_of_scope', count.scopeKind === 'bins' ? `Bin ${bin.code} is not part of count ${count.number}.` : `${part.number} is not in a category of count ${count.number}.`);
      const busy = await linesInOpenCounts(manager, shopId, count.id);
      if (busy.has(lineKey(ref))) throw stockConflict('count_overlap', `That stock is being counted in count ${busy.get(lineKey(ref))}.`, { count: busy.get(lineKey(ref)) });
      const stockLine = await shopScoped(manager, StockLineEntity, shopId).findOne(ref);
      const frozen = (stockLine?.onHand ?? 0) - (await netMovedSince(manager, shopId, ref, count.freezeSeq));
      line = { id: randomUUID(), shopId, countId, ...ref, frozenQuantity: Math.max(0, frozen), added: true, countedQuantity: null, movedSinceFreeze: null, countedAt: null, countedByUserId: null, postedMovementId: null };
      await manager.insert(StockCountLineEntity, line);
    }
  }
  const moved = await netMovedSince(manager, shopId, line, count.freezeSeq);
  const counted = input.mode === 'add' ? (line.countedQuantity ?? 0) + input.quantity : input.quantity;
  await manager.update(StockCountLineEntity, { shopId, id: line.id }, { countedQuantity: counted, movedSinceFreeze: moved, countedAt: ctx.at, countedByUserId: ctx.actor.userId });
  await audit(manager, shopId, ctx, 'stock_count.counted', count.id, {
    line: { before: null, after: line.id },
    part: { before: null, after: line.partId },
    bin: { before: null, after: line.binId },
    condition: { before: null, after: line.condition },
    countedQuantity: { before: line.countedQuantity, after: counted },
    expectedQuantity: { before: null, after: line.frozenQuantity + moved },
    mode: { before: null, after: input.mode },
  });
  return line.id;
}

/** Posts an open count inside the caller's write (see the service's `post`). */
export async function postCount(manager: EntityManager, shopId: string, countId: string, ctx: StockWriteContext): Promise<void> {
  const count = await countOf(manager, shopId, countId);
  requireOpen(count);
  const lines = (await shopScoped(manager, StockCountLineEntity, shopId).find({ countId })).filter((l) => l.countedQuantity !== null);
  const parts = lines.length ? await shopScoped(manager, PartEntity, shopId).find({ id: In([...new Set(lines.map((l) => l.partId))]) }) : [];
  const numberOf = new Map(parts.map((p) => [p.id, p.number]));
  const pools = await averageCosts(manager, shopId, lines.map((l) => l.partId));
  const serialised = lines.filter((l) => varianceOf(l) !== 0 && pools.get(`${l.partId}|${l.condition}`)?.method === 'specific' && pools.get(`${l.partId}|${l.condition}`)?.unitCost !== null);
  if (serialised.length > 0) {
    throw stockConflict('serialised', `${serialised.map((l) => numberOf.get(l.partId)).join(', ')} ${serialised.length === 1 ? 'is' : 'are'} tracked by serial number: a count cannot change them. Issue, return or receive the numbered items, then count again.`, { parts: serialised.map((l) => numberOf.get(l.partId)) });
  }
  let total = 0;
  for (const line of lines) {
    const variance = varianceOf(line)!;
    const now = (await shopScoped(manager, StockLineEntity, shopId).findOne({ partId: line.partId, binId: line.binId, condition: line.condition }))?.onHand ?? 0;
    const target = now + variance;
    if (target < 0) throw stockConflict('count_below_zero', `${numberOf.get(line.partId)} in that bin: ${now} on hand now, a variance of ${variance} would leave less than nothing. Count the line again.`, { part: numberOf.get(line.partId), onHand: now, variance });
    let unitCostMinor: number | undefined;
    if (variance > 0 && (pools.get(`${line.partId}|${line.condition}`)?.unitCost ?? null) === null) {
      const cost = await lastUnitCost(manager, shopId, line.partId, line.condition);
      if (cost === null) throw stockConflict('no_cost_basis', `${numberOf.get(line.partId)} was found but has never had a cost: receive it with its cost instead of counting it in.`, { part: numberOf.get(line.partId) });
      unitCostMinor = cost;
    }
    const [movement] = await countStock(manager, shopId, { partId: line.partId, binId: line.binId, condition: line.condition, countedQuantity: target, unitCostMinor, reference: `Stock count ${count.number}` }, ctx);
    total += movement!.valueChangeMinor;
    await manager.update(StockCountLineEntity, { shopId, id: line.id }, { postedMovementId: movement!.id });
  }
  await manager.update(StockCountEntity, { shopId, id: count.id }, { status: 'posted', closedAt: ctx.at, closedByUserId: ctx.actor.userId });
  await audit(manager, shopId, ctx, 'stock_count.posted', count.id, {
    status: { before: 'open', after: 'posted' },
    linesPosted: { before: null, after: lines.length },
    valueChangeMinor: { before: null, after: total },
  });
}

/** Abandons an open count inside the caller's write. */
export async function abandonCount(manager: EntityManager, shopId: string, countId: string, ctx: StockWriteContext): Promise<void> {
  const count = await countOf(manager, shopId, countId);
  requireOpen(count);
  await manager.update(StockCountEntity, { shopId, id: count.id }, { status: 'abandoned', closedAt: ctx.at, closedByUserId: ctx.actor.userId });
  await audit(manager, shopId, ctx, 'stock_count.abandoned', count.id, { status: { before: 'open', after: 'abandoned' } });
}

export function createCountsService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  const ctxOf = (actor: AuditActor): StockWriteContext => ({ actor, at: clock.now() });

  async function names(ids: Array<string | null>): Promise<Map<string, string>> {
    const list = [...new Set(ids.filter((id): id is string => id !== null))];
    if (list.length === 0) return new Map();
    const rows = await db.reader.query<Array<{ id: string; name: string }>>(`SELECT id, name FROM users WHERE id IN (${list.map(() => '?').join(', ')})`, list);
    return new Map(rows.map((r) => [r.id, r.name]));
  }

  async function summaries(shopId: string, counts: StockCountRow[]): Promise<CountSummary[]> {
    if (counts.length === 0) return [];
    const ids = counts.map((c) => c.id);
    const stats = await db.reader.query<Array<{ countId: string; lines: number; counted: number; differences: number }>>(
      `SELECT count_id AS countId, COUNT(*) AS lines, SUM(CASE WHEN counted_quantity IS NOT NULL THEN 1 ELSE 0 END) AS counted,
         SUM(CASE WHEN counted_quantity IS NOT NULL AND counted_quantity <> frozen_quantity + COALESCE(moved_since_freeze, 0) THEN 1 ELSE 0 END) AS differences
       FROM stock_count_lines WHERE shop_id = ? AND count_id IN (${ids.map(() => '?').join(', ')}) GROUP BY count_id`,
      [shopId, ...ids],
    );
    const statOf = new Map(stats.map((s) => [s.countId, s]));
    const binIds = [...new Set(counts.flatMap((c) => scopeOf(c).binIds))];
    const bins = binIds.length ? await shopScoped(db.reader, BinEntity, shopId).find({ id: In(binIds) }) : [];
    const binCode = new Map(bins.map((b) => [b.id, b.code]));
    const who = await names(counts.flatMap((c) => [c.startedByUserId, c.closedByUserId]));
    return counts.map((c) => {
      const scope = scopeOf(c);
      const s = statOf.get(c.id);
      return {
        id: c.id,
        number: c.number,
        status: c.status,
        scope: { bins: scope.binIds.map((id) => ({ id, code: binCode.get(id) ?? '?' })).sort((a, b) => a.code.localeCompare(b.code)), categories: scope.categories },
        note: c.note,
        started: { at: isoOf(c.startedAt), userId: c.startedByUserId, name: c.startedByUserId ? (who.get(c.startedByUserId) ?? null) : null },
        closed: c.closedAt ? { at: isoOf(c.closedAt), userId: c.closedByUserId, name: c.closedByUserId ? (who.get(c.closedByUserId) ?? null) : null } : null,
        lineCount: Number(s?.lines ?? 0),
        countedCount: Number(s?.counted ?? 0),
        differenceCount: Number(s?.differences ?? 0),
      };
    });
  }

  async function lineViews(shopId: string, countId: string, onlyIds?: string[]): Promise<CountLine[]> {
    const rows = await db.reader.query<
      Array<{
        id: string;
        partId: string;
        partNumber: string;
        partDescription: string;
        category: string | null;
        binId: string;
        binCode: string;
        condition: StockCondition;
        frozenQuantity: number;
        added: number;
        countedQuantity: number | null;
        movedSinceFreeze: number | null;
        countedAt: string | null;
        countedByUserId: string | null;
        countedByName: string | null;
        method: string | null;
      }>
    >(
      `SELECT l.id, l.part_id AS partId, p.number AS partNumber, p.description AS partDescription, p.category, l.bin_id AS binId, b.code AS binCode, l.condition,
         l.frozen_quantity AS frozenQuantity, l.added, l.counted_quantity AS countedQuantity, l.moved_since_freeze AS movedSinceFreeze,
         l.counted_at AS countedAt, l.counted_by_user_id AS countedByUserId, u.name AS countedByName, sp.method
       FROM stock_count_lines l
       JOIN parts p ON p.shop_id = l.shop_id AND p.id = l.part_id
       JOIN stock_bins b ON b.shop_id = l.shop_id AND b.id = l.bin_id
       LEFT JOIN stock_pools sp ON sp.shop_id = l.shop_id AND sp.part_id = l.part_id AND sp.condition = l.condition
       LEFT JOIN users u ON u.id = l.counted_by_user_id
       WHERE l.shop_id = ? AND l.count_id = ?
       ORDER BY b.code_key, p.key, l.condition`,
      [shopId, countId],
    );
    return rows
      .filter((r) => !onlyIds || onlyIds.includes(r.id))
      .map((r) => {
        const counted = r.countedQuantity === null ? null : Number(r.countedQuantity);
        const moved = r.movedSinceFreeze === null ? null : Number(r.movedSinceFreeze);
        const expected = counted === null ? null : Number(r.frozenQuantity) + (moved ?? 0);
        return {
          id: r.id,
          partId: r.partId,
          partNumber: r.partNumber,
          partDescription: r.partDescription,
          category: r.category,
          binId: r.binId,
          binCode: r.binCode,
          condition: r.condition,
          serialised: r.method === 'specific',
          frozenQuantity: Number(r.frozenQuantity),
          added: Boolean(r.added),
          countedQuantity: counted,
          movedSinceFreeze: counted === null ? null : moved,
          expectedQuantity: expected,
          variance: counted === null || expected === null ? null : counted - expected,
          counted: r.countedAt ? { at: isoOf(r.countedAt), userId: r.countedByUserId, name: r.countedByName } : null,
        };
      });
  }

  async function detail(shopId: string, countId: string): Promise<CountDetail> {
    const count = await countOf(db.reader, shopId, countId);
    const [summary] = await summaries(shopId, [count]);
    return { ...summary!, lines: await lineViews(shopId, countId) };
  }

  return {
    async list(shopId: string, query: { status?: CountStatus }): Promise<{ counts: CountSummary[] }> {
      const counts = await shopScoped(db.reader, StockCountEntity, shopId).find(query.status ? { status: query.status } : {}, { number: 'DESC' });
      return { counts: await summaries(shopId, counts.slice(0, 200)) };
    },

    detail,

    /**
     * Starts a count of chosen bins or categories: every line in scope with stock on hand is
     * frozen at its current quantity. Unknown or foreign bins are a 404; a line already in another
     * open count is a 409 (two counts posting the same line would apply its variance twice).
     */
    async start(shopId: string, input: CountStartParsed, actor: AuditActor): Promise<CountDetail> {
      const id = await db.write((manager) => startCount(manager, shopId, input, ctxOf(actor)));
      return detail(shopId, id);
    },

    /**
     * Records what someone counted on a line. `set` replaces the line's count, `add` adds to it;
     * either way the line remembers who entered it last, when, and the net movements on the line
     * since the freeze up to that moment. A part found in a bin of the count that was not on the
     * list gets a line of its own (frozen at what the ledger says it had at the freeze).
     */
    async enter(shopId: string, countId: string, input: CountEntryParsed, actor: AuditActor): Promise<CountLine> {
      const lineId = await db.write((manager) => enterCount(manager, shopId, countId, input, ctxOf(actor)));
      const [view] = await lineViews(shopId, countId, [lineId]);
      return view!;
    },

    /**
     * Quantity and value differences of every counted line, differences first. Open counts are
     * valued at each part's moving-average cost now; posted counts at what the ledger moved.
     */
    async variances(shopId: string, countId: string): Promise<VarianceReport> {
      const count = await countOf(db.reader, shopId, countId);
      const lines = await lineViews(shopId, countId);
      const counted = lines.filter((l) => l.countedQuantity !== null);
      const costs = await averageCosts(db.reader, shopId, counted.map((l) => l.partId));
      const posted = new Map<string, number>();
      if (count.status === 'posted') {
        const rows = await db.reader.query<Array<{ lineId: string; value: number }>>(
          `SELECT l.id AS lineId, m.value_change_minor AS value FROM stock_count_lines l JOIN stock_movements m ON m.shop_id = l.shop_id AND m.id = l.posted_movement_id WHERE l.shop_id = ? AND l.count_id = ?`,
          [shopId, countId],
        );
        for (const r of rows) posted.set(r.lineId, Number(r.value));
      }
      const out: VarianceLine[] = counted.map((l) => {
        const variance = l.variance ?? 0;
        const cost = costs.get(`${l.partId}|${l.condition}`)?.unitCost ?? null;
        const value = posted.has(l.id) ? posted.get(l.id)! : cost === null ? (variance === 0 ? 0 : null) : Math.round(variance * cost);
        return {
          lineId: l.id,
          partId: l.partId,
          partNumber: l.partNumber,
          partDescription: l.partDescription,
          binCode: l.binCode,
          condition: l.condition,
          serialised: l.serialised,
          expectedQuantity: l.expectedQuantity ?? 0,
          countedQuantity: l.countedQuantity ?? 0,
          variance,
          unitCostMinor: cost === null ? null : Math.round(cost),
          valueDifferenceMinor: value === null ? null : value || 0,
        };
      });
      out.sort((a, b) => Number(b.variance !== 0) - Number(a.variance !== 0) || Math.abs(b.valueDifferenceMinor ?? 0) - Math.abs(a.valueDifferenceMinor ?? 0) || a.binCode.localeCompare(b.binCode) || a.partNumber.localeCompare(b.partNumber));
      const totals = { over: 0, short: 0, valueOverMinor: 0, valueShortMinor: 0, netValueMinor: 0 };
      for (const l of out) {
        if (l.variance > 0) totals.over += l.variance;
        if (l.variance < 0) totals.short += -l.variance;
        const v = l.valueDifferenceMinor ?? 0;
        if (v > 0) totals.valueOverMinor += v;
        if (v < 0) totals.valueShortMinor += -v;
        totals.netValueMinor += v;
      }
      return {
        countId,
        status: count.status,
        currency: await currencyOf(db.reader, shopId),
        lines: out,
        uncountedCount: lines.length - counted.length,
        totals,
        postedValueMinor: count.status === 'posted' ? [...posted.values()].reduce((s, v) => s + v, 0) : null,
      };
    },

    /**
     * Posts an open count in one transaction: each counted line gets a `counted` movement (through
     * countStock, referenced "Stock count N") that sets it to what it holds now plus its variance,
     * so movements after the entry are kept. Uncounted lines are left as they are. Refused whole
     * (409, nothing written) when a serialised line has a variance, a line would go below zero or
     * below what is held, or found stock has no cost to value it at.
     */
    async post(shopId: string, countId: string, actor: AuditActor): Promise<CountDetail> {
      await db.write((manager) => postCount(manager, shopId, countId, ctxOf(actor)));
      return detail(shopId, countId);
    },

    /** Abandons an open count: its entries are kept for the record, stock is not touched. */
    async abandon(shopId: string, countId: string, actor: AuditActor): Promise<CountDetail> {
      await db.write((manager) => abandonCount(manager, shopId, countId, ctxOf(actor)));
      return detail(shopId, countId);
    },

    /** The bins a count covers (its chosen bins, or the bins of its lines), by code. */
    async binIdsOf(shopId: string, countId: string): Promise<string[]> {
      const count = await countOf(db.reader, shopId, countId);
      const scope = scopeOf(count);
      const lineBins = (await shopScoped(db.reader, StockCountLineEntity, shopId).find({ countId })).map((l) => l.binId);
      const ids = [...new Set([...scope.binIds, ...lineBins])];
      if (ids.length === 0) return [];
      const bins = await shopScoped(db.reader, BinEntity, shopId).find({ id: In(ids) });
      return bins.sort((a, b) => a.codeKey.localeCompare(b.codeKey)).map((b) => b.id);
    },
  };
}

export type CountsService = ReturnType<typeof createCountsService>;
