import type { EntityManager } from 'typeorm';
import { closingPosition, ValuationError, type StockMovement } from '@tappet/domain';
import type { MovementKind } from '@tappet/contracts';

/** One cached balance that disagrees with the ledger. */
export interface LedgerMismatch {
  shopId: string;
  /** `line`: on hand of a part × bin × condition; `held`: its held quantity; `pool`: quantity or value of a part × condition; `movement`: a stored value change; `serial`: items on the shelf. */
  kind: 'line' | 'held' | 'pool' | 'movement' | 'serial';
  /** What it is about, e.g. "part 1f…/bin 9c…/new". */
  subject: string;
  expected: number | string;
  actual: number | string;
}

const num = (v: unknown) => Number(v ?? 0);

/**
 * Recomputes every cached stock balance from the append-only ledger and lists each disagreement:
 * line quantities (Σ movements, moves counted out of one bin and into the other), held quantities
 * (Σ active holds), each pool's quantity and value (the movements folded again through the
 * valuation library, in ledger order), every movement's stored value change, and serialised
 * items on the shelf. An empty list means the ledger and the balances agree. All shops, or one.
 */
export async function checkLedger(reader: EntityManager, shopId?: string): Promise<LedgerMismatch[]> {
  const shopFilter = shopId ? 'WHERE shop_id = ?' : '';
  const shopParams = shopId ? [shopId] : [];
  const out: LedgerMismatch[] = [];

  // 1. On hand per line.
  const fromLedger = await reader.query<Array<{ shopId: string; partId: string; binId: string; condition: string; q: number }>>(
    `SELECT shop_id AS shopId, part_id AS partId, bin_id AS binId, condition, SUM(d) AS q FROM (
       SELECT shop_id, part_id, bin_id, condition, quantity_delta AS d FROM stock_movements ${shopFilter}
       UNION ALL SELECT shop_id, part_id, to_bin_id, condition, -quantity_delta FROM stock_movements WHERE kind = 'moved'${shopId ? ' AND shop_id = ?' : ''}
     ) AS ledger GROUP BY shop_id, part_id, bin_id, condition`,
    [...shopParams, ...shopParams],
  );
  const cached = await reader.query<Array<{ shopId: string; partId: string; binId: string; condition: string; onHand: number; held: number }>>(
    `SELECT shop_id AS shopId, part_id AS partId, bin_id AS binId, condition, on_hand AS onHand, held FROM stock_lines ${shopFilter}`,
    shopParams,
  );
  const lineKey = (r: { shopId: string; partId: string; binId: string; condition: string }) => `${r.shopId}|${r.partId}|${r.binId}|${r.condition}`;
  const ledgerQ = new Map(fromLedger.map((r) => [lineKey(r), num(r.q)]));
  const cachedQ = new Map(cached.map((r) => [lineKey(r), r]));
  for (const key of new Set([...ledgerQ.keys(), ...cachedQ.keys()])) {
    const expected = ledgerQ.get(key) ?? 0;
    const actual = num(cachedQ.get(key)?.onHand);
    const [s, p, b, c] = key.split('|');
    if (expected !== actual) out.push({ shopId: s!, kind: 'line', subject: `part ${p}/bin ${b}/${c}`, expected, actual });
  }

  // 2. Held per line.
  const holds = await reader.query<Array<{ shopId: string; partId: string; binId: string; condition: string; q: number }>>(
    `SELECT shop_id AS shopId, part_id AS partId, bin_id AS binId, condition, SUM(quantity) AS q FROM stock_holds WHERE status = 'active'${shopId ? ' AND shop_id = ?' : ''} GROUP BY shop_id, part_id, bin_id, condition`,
    shopParams,
  );
  const heldQ = new Map(holds.map((r) => [lineKey(r), num(r.q)]));
  for (const key of new Set([...heldQ.keys(), ...cachedQ.keys()])) {
    const expected = heldQ.get(key) ?? 0;
    const actual = num(cachedQ.get(key)?.held);
    const [s, p, b, c] = key.split('|');
    if (expected !== actual) out.push({ shopId: s!, kind: 'held', subject: `part ${p}/bin ${b}/${c}`, expected, actual });
  }

  // 3. Pools and every movement's value change, folded again in ledger order.
  const movements = await reader.query<Array<{ id: string; shopId: string; seq: number; kind: MovementKind; partId: string; condition: string; delta: number; unitCost: number | null; valueChange: number; serialId: string | null; serialCost: number | null }>>(
    `SELECT m.id, m.shop_id AS shopId, m.seq, m.kind, m.part_id AS partId, m.condition, m.quantity_delta AS delta, m.unit_cost_minor AS unitCost,
       m.value_change_minor AS valueChange, m.serial_id AS serialId, s.cost_minor AS serialCost
     FROM stock_movements m LEFT JOIN stock_serials s ON s.shop_id = m.shop_id AND s.id = m.serial_id
     ${shopId ? 'WHERE m.shop_id = ?' : ''} ORDER BY m.shop_id, m.seq`,
    shopParams,
  );
  const positions = new Map<string, { quantity: number; value: number }>();
  for (const m of movements) {
    if (m.kind === 'moved') continue;
    const key = `${m.shopId}|${m.partId}|${m.condition}`;
    const before = positions.get(key) ?? { quantity: 0, value: 0 };
    let change: number;
    if (m.serialId !== null) {
      change = m.delta > 0 ? num(m.serialCost) : -num(m.serialCost);
    } else if (m.delta === 0) {
      change = 0;
    } else {
      const movement: StockMovement =
        m.kind === 'received'
          ? { kind: 'receipt', quantity: m.delta, unitCost: num(m.unitCost) }
          : m.kind === 'issued'
            ? { kind: 'issue', quantity: -m.delta }
            : m.kind === 'returned'
              ? { kind: 'return', quantity: m.delta, ...(m.unitCost === null ? {} : { unitCost: m.unitCost }) }
              : { kind: 'adjustment', quantityDelta: m.delta, ...(m.delta > 0 && m.unitCost !== null ? { unitCost: m.unitCost } : {}) };
      try {
        change = closingPosition([movement], before).value - before.value;
      } catch (error) {
        if (!(error instanceof ValuationError)) throw error;
        out.push({ shopId: m.shopId, kind: 'movement', subject: `movement ${m.seq} (${m.id})`, expected: `a valid movement (${error.code})`, actual: m.kind });
        change = m.valueChange;
      }
    }
    if (change !== num(m.valueChange)) out.push({ shopId: m.shopId, kind: 'movement', subject: `movement ${m.seq} (${m.id}) value change`, expected: change, actual: num(m.valueChange) });
    positions.set(key, { quantity: before.quantity + m.delta, value: before.value + change });
  }
  const pools = await reader.query<Array<{ shopId: string; partId: string; condition: string; method: string; quantity: number; value: number }>>(
    `SELECT shop_id AS shopId, part_id AS partId, condition, method, quantity, value_minor AS value FROM stock_pools ${shopFilter}`,
    shopParams,
  );
  const poolRows = new Map(pools.map((p) => [`${p.shopId}|${p.partId}|${p.condition}`, p]));
  for (const key of new Set([...positions.keys(), ...poolRows.keys()])) {
    const expected = positions.get(key) ?? { quantity: 0, value: 0 };
    const pool = poolRows.get(key);
    const [s, p, c] = key.split('|');
    if (expected.quantity !== num(pool?.quantity)) out.push({ shopId: s!, kind: 'pool', subject: `part ${p}/${c} quantity`, expected: expected.quantity, actual: num(pool?.quantity) });
    if (expected.value !== num(pool?.value)) out.push({ shopId: s!, kind: 'pool', subject: `part ${p}/${c} value`, expected: expected.value, actual: num(pool?.value) });
  }

  // 4. Serialised lines: exactly the numbered items on the shelf.
  const serialLines = await reader.query<Array<{ shopId: string; partId: string; binId: string; condition: string; onHand: number; items: number }>>(
    `SELECT l.shop_id AS shopId, l.part_id AS partId, l.bin_id AS binId, l.condition, l.on_hand AS onHand,
       (SELECT COUNT(*) FROM stock_serials s WHERE s.shop_id = l.shop_id AND s.part_id = l.part_id AND s.bin_id = l.bin_id AND s.condition = l.condition AND s.in_stock = 1) AS items
     FROM stock_lines l JOIN stock_pools sp ON sp.shop_id = l.shop_id AND sp.part_id = l.part_id AND sp.condition = l.condition
     WHERE sp.method = 'specific'${shopId ? ' AND l.shop_id = ?' : ''}`,
    shopParams,
  );
  for (const r of serialLines) {
    if (num(r.items) !== num(r.onHand)) out.push({ shopId: r.shopId, kind: 'serial', subject: `part ${r.partId}/bin ${r.binId}/${r.condition}`, expected: num(r.onHand), actual: num(r.items) });
  }
  return out;
}
