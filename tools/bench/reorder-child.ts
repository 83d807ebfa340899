/* eslint-disable @nx/enforce-module-boundaries -- the benchmark runs the API's own reorder service in this
   process, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// One generated shop and the reorder list over it, in a fresh process:
//   npx tsx tools/bench/reorder-child.ts <stocked parts> <runs>
// The shop is written straight into SQLite after the migrations (prepared statements inside one
// db.write, far faster than the services), then the reorder-list service call is timed.
// Prints one JSON line: { parts, movements, generateSeconds, timesMs, suggestions }.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createDataSource, sqliteHandle } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createMemoryMailer } from '../../apps/api/src/lib/mailer';
import { createCatalogueService } from '../../apps/api/src/modules/catalogue/catalogue.service';
import { createOrdersService } from '../../apps/api/src/modules/purchasing/orders.service';
import { createReorderService } from '../../apps/api/src/modules/purchasing/reorder.service';
import { createSuppliersService } from '../../apps/api/src/modules/purchasing/suppliers.service';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { prng } from './harness';

/** The part of better-sqlite3's connection the generator uses (the package ships no types). */
interface RawSqlite {
  prepare(sql: string): { run(...params: unknown[]): unknown };
  exec(sql: string): unknown;
}

const partCount = Number(process.argv[2] ?? 50_000);
const runs = Number(process.argv[3] ?? 5);
const DAY = 86_400_000;
const sqlDate = (ms: number) => new Date(ms).toISOString().replace('T', ' ').replace('Z', '');

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-reorder-bench-'));
const dataSource = createDataSource(path.join(dir, 'bench.sqlite'));
await dataSource.initialize();
await dataSource.runMigrations();
const db = databaseFor(dataSource);
try {
  const { shop } = await createShopWithUsers(db, systemClock, { roles: ['owner'], namePrefix: 'Reorder Bench' });
  const generateStart = performance.now();
  const movements = await db.write(async () => generateShop(sqliteHandle(dataSource) as unknown as RawSqlite, shop.id));
  const generateSeconds = (performance.now() - generateStart) / 1000;
  (sqliteHandle(dataSource) as unknown as RawSqlite).exec('ANALYZE');

  const catalogue = createCatalogueService({ db, clock: systemClock });
  const suppliers = createSuppliersService({ db, clock: systemClock });
  const orders = createOrdersService({ db, clock: systemClock, mailer: createMemoryMailer() });
  const reorder = createReorderService({ db, clock: systemClock, catalogue, suppliers, orders });
  const timesMs: number[] = [];
  let suggestions = 0;
  for (let i = 0; i <= runs; i++) {
    const t0 = performance.now();
    const list = await reorder.list(shop.id);
    // The first call also builds the catalogue's lineage graph (cached per catalogue version): timed apart.
    timesMs.push(performance.now() - t0);
    suggestions = list.suggestions.length;
  }
  console.log(JSON.stringify({ parts: partCount, movements, generateSeconds, firstMs: timesMs[0], timesMs: timesMs.slice(1), suggestions }));
} finally {
  await dataSource.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
}

/**
 * A shop with `partCount` stocked parts: 30 % of them replaced by a later number (so demand rolls
 * up through the lineage), one bin line and cost pool each, two years of receipts, issues and job
 * returns (about 9 movements a part), 40 suppliers listing every part, a few parts with manual
 * minimums, and open orders. Returns the number of movements written.
 */
function generateShop(sql: RawSqlite, shopId: string): number {
  const rand = prng(partCount);
  const now = Date.now();
  const at = sqlDate(now);
  const partId = (i: number) => `bench-part-${i}`;

  const insertPart = sql.prepare(`INSERT INTO parts (id, shop_id, number, key, description, origin, maker, category, unit, status, notes, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, 'genuine', NULL, 'Bench', 'each', ?, NULL, ?, ?)`);
  for (let i = 0; i < partCount; i++) {
    const number = `RB-${String(i).padStart(7, '0')}`;
    insertPart.run(partId(i), shopId, number, number.replace(/[^A-Z0-9]/g, ''), `Bench part ${i}`, rand() < 0.03 ? 'nla' : 'available', at, at);
  }
  const insertLink = sql.prepare(`INSERT OR IGNORE INTO part_links (id, shop_id, from_part_id, kind, to_part_id, to_number, to_key, quantity, interchange)
    VALUES (?, ?, ?, 'replaced_by', ?, ?, ?, ?, ?)`);
  for (let n = 0; n < Math.round(partCount * 0.3); n++) {
    const from = Math.floor(rand() * (partCount - 10));
    const to = from + 1 + Math.floor(rand() * 9);
    const toNumber = `RB-${String(to).padStart(7, '0')}`;
    insertLink.run(`bench-link-${n}`, shopId, partId(from), partId(to), toNumber, toNumber.replace(/[^A-Z0-9]/g, ''), rand() < 0.1 ? 2 : 1, rand() < 0.5 ? 'both' : 'one_way');
  }

  const binCount = 200;
  const insertBin = sql.prepare(`INSERT INTO stock_bins (id, shop_id, code, code_key, description, active, created_at, updated_at) VALUES (?, ?, ?, ?, NULL, 1, ?, ?)`);
  for (let b = 0; b < binCount; b++) insertBin.run(`bench-bin-${b}`, shopId, `B-${b}`, `B${b}`, at, at);

  const supplierCount = 40;
  const insertSupplier = sql.prepare(`INSERT INTO suppliers (id, shop_id, name, name_key, email, currency, lead_time_days, lead_time_sd_days, min_order_value_minor, notes, active, created_at, updated_at)
    VALUES (?, ?, ?, ?, NULL, 'GBP', ?, ?, ?, NULL, 1, ?, ?)`);
  for (let s = 0; s < supplierCount; s++) insertSupplier.run(`bench-supplier-${s}`, shopId, `Bench Supplier ${s}`, `bench supplier ${s}`, 3 + (s % 20), s % 3 === 0 ? 2 : null, s % 4 === 0 ? 10_000 : 0, at, at);
  const insertListing = sql.prepare(`INSERT INTO supplier_listings (id, shop_id, supplier_id, part_id, supplier_number, price_minor, pack_size, min_order_qty, lead_time_days, last_paid_unit_minor, last_paid_at, created_at, updated_at)
    VALUES (?, ?, ?, ?, NULL, ?, ?, ?, NULL, ?, NULL, ?, ?)`);
  const insertPurchasing = sql.prepare(`INSERT INTO part_purchasing (shop_id, part_id, preferred_supplier_id, min_qty, max_qty, updated_at) VALUES (?, ?, ?, ?, ?, ?)`);

  const insertLine = sql.prepare(`INSERT INTO stock_lines (shop_id, part_id, bin_id, condition, on_hand, held, updated_at) VALUES (?, ?, ?, 'new', ?, 0, ?)`);
  const insertPool = sql.prepare(`INSERT INTO stock_pools (shop_id, part_id, condition, method, quantity, value_minor, updated_at) VALUES (?, ?, 'new', 'average', ?, ?, ?)`);
  const insertMovement = sql.prepare(`INSERT INTO stock_movements (id, shop_id, seq, kind, part_id, bin_id, to_bin_id, condition, quantity_delta, counted_quantity, unit_cost_minor, value_change_minor, serial_id, reason, reference, note, hold_id, job_id, occurred_at, recorded_at, user_id, api_key_id)
    VALUES (?, ?, ?, ?, ?, ?, NULL, 'new', ?, NULL, ?, ?, NULL, NULL, NULL, NULL, NULL, NULL, ?, ?, NULL, NULL)`);
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
      insertMovement.run(`bench-mv-${seq}`, shopId, seq, e.kind, id, bin, delta, cost, delta * cost, sqlDate(e.t), sqlDate(e.t));
    }
    insertLine.run(shopId, id, bin, onHand, at);
    insertPool.run(shopId, id, onHand, onHand > 0 ? onHand * cost : 0, at);
    insertListing.run(`bench-listing-${i}`, shopId, `bench-supplier-${i % supplierCount}`, id, cost, rand() < 0.2 ? 5 : 1, 0, rand() < 0.5 ? cost : null, at, at);
    if (rand() < 0.05) insertPurchasing.run(shopId, id, null, 2, 10, at);
  }

  // Open orders: 100 of 10 lines each, so stock on order counts for a thousand parts.
  const insertOrder = sql.prepare(`INSERT INTO purchase_orders (id, shop_id, number, supplier_id, status, currency, exchange_rate, total_minor, total_shop_minor, note, created_by_user_id, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, 'GBP', '1', 0, 0, NULL, NULL, ?, ?)`);
  const insertOrderLine = sql.prepare(`INSERT INTO purchase_order_lines (id, shop_id, order_id, position, part_id, supplier_number, description, quantity, received_quantity, cancelled_quantity, unit_price_minor, core_deposit_minor, purpose, special_order_id)
    VALUES (?, ?, ?, ?, ?, NULL, 'Bench line', ?, 0, 0, 1000, 0, NULL, NULL)`);
  const statuses = ['draft', 'approved', 'sent'];
  for (let o = 0; o < 100; o++) {
    const orderId = `bench-order-${o}`;
    insertOrder.run(orderId, shopId, o + 1, `bench-supplier-${o % supplierCount}`, statuses[o % statuses.length], at, at);
    for (let l = 0; l < 10; l++) insertOrderLine.run(`bench-order-line-${o}-${l}`, shopId, orderId, l + 1, partId(Math.floor(rand() * partCount)), 1 + (l % 5));
  }
  return seq;
}
