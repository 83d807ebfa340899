// A generated shop for the reorder list, shared by its benchmark (tools/bench/reorder-child.ts, 10k
// to 200k parts) and the API test that checks the list on a whole shop (a few hundred parts).
// Rows are handed to `insert` one by one, each table always with the same columns, so the
// benchmark can prepare one statement a table and the test can run portable INSERTs.

/** Receives one row for one table; the keys are the column names. */
export type RowSink = (table: string, row: Record<string, unknown>) => void;

const DAY = 86_400_000;
const sqlDate = (ms: number) => new Date(ms).toISOString().replace('T', ' ').replace('Z', '');

/**
 * A shop with `partCount` stocked parts: 30 % of them replaced by a later number (so demand rolls
 * up through the lineage), one bin line and cost pool each, two years of receipts, issues and job
 * returns up to `now` (about 9 movements a part), 40 suppliers listing every part, a few parts with
 * manual minimums, and open orders. `rand` draws the shop (same draws, same shop). Returns the
 * number of movements written.
 */
export function generateReorderShop(insert: RowSink, options: { shopId: string; partCount: number; now: number; rand: () => number }): number {
  const { shopId, partCount, now, rand } = options;
  const at = sqlDate(now);
  const partId = (i: number) => `bench-part-${i}`;
  const numberOf = (i: number) => `RB-${String(i).padStart(7, '0')}`;

  for (let i = 0; i < partCount; i++) {
    const number = numberOf(i);
    insert('parts', {
      id: partId(i), shop_id: shopId, number, key: number.replace(/[^A-Z0-9]/g, ''), description: `Bench part ${i}`, origin: 'genuine', maker: null, category: 'Bench', unit: 'each',
      status: rand() < 0.03 ? 'nla' : 'available', notes: null, created_at: at, updated_at: at,
    });
  }
  // A second link between the same two parts is left out (the table allows one per pair).
  const linked = new Set<string>();
  for (let n = 0; n < Math.round(partCount * 0.3); n++) {
    const from = Math.floor(rand() * (partCount - 10));
    const to = from + 1 + Math.floor(rand() * 9);
    const quantity = rand() < 0.1 ? 2 : 1;
    const interchange = rand() < 0.5 ? 'both' : 'one_way';
    if (linked.has(`${from}>${to}`)) continue;
    linked.add(`${from}>${to}`);
    const toNumber = numberOf(to);
    insert('part_links', { id: `bench-link-${n}`, shop_id: shopId, from_part_id: partId(from), kind: 'replaced_by', to_part_id: partId(to), to_number: toNumber, to_key: toNumber.replace(/[^A-Z0-9]/g, ''), quantity, interchange });
  }

  const binCount = 200;
  for (let b = 0; b < binCount; b++) insert('stock_bins', { id: `bench-bin-${b}`, shop_id: shopId, code: `B-${b}`, code_key: `B${b}`, description: null, active: 1, created_at: at, updated_at: at });

  const supplierCount = 40;
  for (let s = 0; s < supplierCount; s++) {
    insert('suppliers', {
      id: `bench-supplier-${s}`, shop_id: shopId, name: `Bench Supplier ${s}`, name_key: `bench supplier ${s}`, email: null, currency: 'GBP', lead_time_days: 3 + (s % 20),
      lead_time_sd_days: s % 3 === 0 ? 2 : null, min_order_value_minor: s % 4 === 0 ? 10_000 : 0, notes: null, active: 1, created_at: at, updated_at: at,
    });
  }

  const twoYears = 730 * DAY;
  let seq = 0;
  for (let i = 0; i < partCount; i++) {
    const id = partId(i);
    const bin = `bench-bin-${i % binCount}`;
    const cost = 100 + Math.floor(rand() * 20_000);
    // Demand varies by part: most slow, some busy, some never issued (dead stock).
    const busy = rand();
    const issues = busy < 0.1 ? 0 : busy < 0.8 ? 1 + Math.floor(rand() * 6) : 6 + Math.floor(rand() * 20);
    const events: Array<{ t: number; kind: 'received' | 'issued' | 'returned'; q: number }> = [];
    let onHand = 0;
    for (let r = 0; r < 2; r++) events.push({ t: now - twoYears + Math.floor(rand() * twoYears), kind: 'received', q: 5 + Math.floor(rand() * 20) });
    for (let k = 0; k < issues; k++) events.push({ t: now - Math.floor(rand() * twoYears), kind: 'issued', q: 1 + Math.floor(rand() * 3) });
    if (issues > 0 && rand() < 0.3) events.push({ t: now - Math.floor(rand() * twoYears), kind: 'returned', q: 1 });
    events.sort((a, b) => a.t - b.t);
    for (const e of events) {
      // Never below zero, as the stock service guarantees.
      const q = e.kind === 'issued' ? Math.min(e.q, onHand) : e.q;
      if (q === 0) continue;
      const delta = e.kind === 'issued' ? -q : q;
      onHand += delta;
      seq++;
      insert('stock_movements', {
        id: `bench-mv-${seq}`, shop_id: shopId, seq, kind: e.kind, part_id: id, bin_id: bin, to_bin_id: null, condition: 'new', quantity_delta: delta, counted_quantity: null, unit_cost_minor: cost,
        value_change_minor: delta * cost, serial_id: null, reason: null, reference: null, note: null, hold_id: null, job_id: null, occurred_at: sqlDate(e.t), recorded_at: sqlDate(e.t), user_id: null, api_key_id: null,
      });
    }
    insert('stock_lines', { shop_id: shopId, part_id: id, bin_id: bin, condition: 'new', on_hand: onHand, held: 0, updated_at: at });
    insert('stock_pools', { shop_id: shopId, part_id: id, condition: 'new', method: 'average', quantity: onHand, value_minor: onHand > 0 ? onHand * cost : 0, updated_at: at });
    insert('supplier_listings', {
      id: `bench-listing-${i}`, shop_id: shopId, supplier_id: `bench-supplier-${i % supplierCount}`, part_id: id, supplier_number: null, price_minor: cost, pack_size: rand() < 0.2 ? 5 : 1, min_order_qty: 0,
      lead_time_days: null, last_paid_unit_minor: rand() < 0.5 ? cost : null, last_paid_at: null, created_at: at, updated_at: at,
    });
    if (rand() < 0.05) insert('part_purchasing', { shop_id: shopId, part_id: id, preferred_supplier_id: null, min_qty: 2, max_qty: 10, updated_at: at });
  }

  // Open orders: 100 of 10 lines each, so stock on order counts for a thousand parts.
  const statuses = ['draft', 'approved', 'sent'];
  for (let o = 0; o < 100; o++) {
    const orderId = `bench-order-${o}`;
    insert('purchase_orders', {
      id: orderId, shop_id: shopId, number: o + 1, supplier_id: `bench-supplier-${o % supplierCount}`, status: statuses[o % statuses.length], currency: 'GBP', exchange_rate: '1', total_minor: 0,
      total_shop_minor: 0, note: null, created_by_user_id: null, created_at: at, updated_at: at,
    });
    for (let l = 0; l < 10; l++) {
      insert('purchase_order_lines', {
        id: `bench-order-line-${o}-${l}`, shop_id: shopId, order_id: orderId, position: l + 1, part_id: partId(Math.floor(rand() * partCount)), supplier_number: null, description: 'Bench line',
        quantity: 1 + (l % 5), received_quantity: 0, cancelled_quantity: 0, unit_price_minor: 1000, core_deposit_minor: 0, purpose: null, special_order_id: null,
      });
    }
  }
  return seq;
}
