import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDataSource, sqliteHandle } from '../data-source';
import { onPostgres, openTestDatabase } from '../../test-support/test-app';
import { createShopWithUsers } from '../../modules/test-support/test-support.service';
import { systemClock } from '../../lib/clock';
import { PartEntity } from '../../modules/catalogue/catalogue.entity';
import { createBin, receiveStock } from '../../modules/stock/stock.service';
import { checkLedger } from '../../modules/stock/stock.ledger-check';
import { ListingEntity, PurchaseOrderEntity, PurchaseOrderLineEntity, SupplierEntity } from '../../modules/purchasing/purchasing.entity';

// Crash tests (issue 13): the process receiving a long purchase order — every line at once, in
// one receipt — is killed with SIGKILL at different moments. After each kill SQLite's integrity
// check passes, every stock balance and pool value still agrees with the ledger, and the receipt
// is wholly there (order received, every line's received quantity, one movement and one receipt
// row per line, stock and valuation moved, listings' last price, the audit entry) or wholly absent.

const repo = path.resolve(import.meta.dirname, '../../../../..');
const worker = path.join(import.meta.dirname, 'fixtures/receipt-worker.ts');
/** The most lines an order may have (the contract's cap). */
const LINES = 500;
const ORDERED = 10;
const PRICE = 1000;
const ON_HAND = 5;
const COST_BEFORE = 1200;

let database: Awaited<ReturnType<typeof openTestDatabase>>;
beforeAll(async () => {
  database = await openTestDatabase();
});
afterAll(() => database.close());

/**
 * A shop with LINES parts, ON_HAND of each in one bin at COST_BEFORE (so a receipt moves the
 * average cost), and a sent order from one supplier for ORDERED of each at PRICE.
 */
async function orderReadyToReceive() {
  const { db } = database;
  const created = await createShopWithUsers(db, systemClock, { roles: ['owner'], namePrefix: 'Receipt Crash' });
  const shopId = created.shop.id;
  const at = new Date();
  const parts = Array.from({ length: LINES }, (_, i) => {
    const number = `RC-${String(i).padStart(5, '0')}`;
    return { id: randomUUID(), shopId, number, key: number.replace(/[^A-Z0-9]/g, ''), description: `Receipt crash part ${i}`, origin: 'genuine' as const, maker: null, category: 'Engine', unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at };
  });
  const supplier = { id: randomUUID(), shopId, name: 'Crash Test Supplies', nameKey: 'crash test supplies', email: null, currency: 'GBP', leadTimeDays: 7, leadTimeSdDays: null, minOrderValueMinor: 0, notes: null, active: true, createdAt: at, updatedAt: at };
  const orderId = randomUUID();
  let binId = '';
  await db.write(async (manager) => {
    await manager.insert(PartEntity, parts);
    await manager.insert(SupplierEntity, supplier);
    await manager.insert(
      ListingEntity,
      parts.map((p) => ({ id: randomUUID(), shopId, supplierId: supplier.id, partId: p.id, supplierNumber: null, priceMinor: PRICE, packSize: 1, minOrderQty: 0, leadTimeDays: null, lastPaidUnitMinor: null, lastPaidAt: null, createdAt: at, updatedAt: at })),
    );
    const ctx = { actor: { userId: null }, at };
    binId = (await createBin(manager, shopId, { code: 'RC-BIN' }, ctx)).id;
    for (const p of parts) await receiveStock(manager, shopId, { partId: p.id, binId, condition: 'new', quantity: ON_HAND, unitCostMinor: COST_BEFORE }, ctx);
    await manager.insert(PurchaseOrderEntity, {
      id: orderId, shopId, number: 1, supplierId: supplier.id, status: 'sent', currency: 'GBP', exchangeRate: '1',
      totalMinor: LINES * ORDERED * PRICE, totalShopMinor: LINES * ORDERED * PRICE, note: null, createdByUserId: null,
      approvalRequestedAt: null, approvedByUserId: null, approvedAt: null, rejectionReason: null, sentAt: at, closedReason: null, closedAt: null, createdAt: at, updatedAt: at,
    });
    await manager.insert(
      PurchaseOrderLineEntity,
      parts.map((p, i) => ({ id: randomUUID(), shopId, orderId, position: i + 1, partId: p.id, supplierNumber: null, description: p.description, quantity: ORDERED, receivedQuantity: 0, cancelledQuantity: 0, unitPriceMinor: PRICE, coreDepositMinor: 0, purpose: null, specialOrderId: null })),
    );
  });
  return { shopId, orderId, binId, userId: created.users[0]!.id };
}

function startReceiving(ready: Awaited<ReturnType<typeof orderReadyToReceive>>) {
  // Node itself with tsx's loader, not the tsx launcher: SIGKILL must reach the process that writes.
  const child = spawn(process.execPath, ['--import', 'tsx', worker, path.join(database.dir, 'tappet.sqlite'), ready.shopId, ready.orderId, ready.binId, ready.userId], { cwd: repo });
  let output = '';
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  // Resolves when the receipt's transaction has begun (the worker says so on its first clock read).
  const inside = new Promise<number>((resolve, reject) => {
    child.stdout.on('data', (d: Buffer) => {
      output += d.toString();
      if (output.includes('inside')) resolve(performance.now());
    });
    child.stderr.on('data', (d: Buffer) => (output += d.toString()));
    void exited.then(() => reject(new Error(`the worker stopped before its receipt began: ${output}`)));
  });
  return { child, inside, exited, output: () => output };
}

/** Everything the receipt touches, as a fresh connection reads it after the crash. */
async function stateOf(shopId: string, orderId: string) {
  const ds = createDataSource(path.join(database.dir, 'tappet.sqlite'));
  await ds.initialize();
  try {
    const one = async (sql: string, params: unknown[] = [shopId]) => Number(Object.values(((await ds.query(sql, params)) as Record<string, unknown>[])[0]!)[0]);
    const integrity = sqliteHandle(ds).pragma('integrity_check', { simple: true });
    const [{ status }] = (await ds.query('SELECT status FROM purchase_orders WHERE shop_id = ? AND id = ?', [shopId, orderId])) as [{ status: string }];
    return {
      integrity,
      status,
      receivedOnLines: await one('SELECT COALESCE(SUM(received_quantity), 0) FROM purchase_order_lines WHERE shop_id = ? AND order_id = ?', [shopId, orderId]),
      receipts: await one('SELECT count(*) FROM purchase_receipts WHERE shop_id = ? AND order_id = ?', [shopId, orderId]),
      movements: await one(`SELECT count(*) FROM stock_movements WHERE shop_id = ? AND kind = 'received' AND reference = 'PO-000001'`),
      onHand: await one('SELECT COALESCE(SUM(on_hand), 0) FROM stock_lines WHERE shop_id = ?'),
      poolValue: await one('SELECT COALESCE(SUM(value_minor), 0) FROM stock_pools WHERE shop_id = ?'),
      listingsPaid: await one('SELECT count(*) FROM supplier_listings WHERE shop_id = ? AND last_paid_at IS NOT NULL'),
      audited: await one(`SELECT count(*) FROM audit_events WHERE shop_id = ? AND action = 'purchase_order.received'`),
      ledgerMismatches: (await checkLedger(ds.manager, shopId)).length,
    };
  } finally {
    await ds.destroy();
  }
}

const received = {
  integrity: 'ok',
  status: 'received',
  receivedOnLines: LINES * ORDERED,
  receipts: LINES,
  movements: LINES,
  onHand: LINES * (ON_HAND + ORDERED),
  poolValue: LINES * (ON_HAND * COST_BEFORE + ORDERED * PRICE),
  listingsPaid: LINES,
  audited: 1,
  ledgerMismatches: 0,
};
const absent = { integrity: 'ok', status: 'sent', receivedOnLines: 0, receipts: 0, movements: 0, onHand: LINES * ON_HAND, poolValue: LINES * ON_HAND * COST_BEFORE, listingsPaid: 0, audited: 0, ledgerMismatches: 0 };

// SQLite-specific by nature (decision 019): kills a process writing a SQLite file and checks the file.
describe.skipIf(onPostgres())('killed in the middle of receiving a long purchase order', () => {
  it('leaves a sound ledger with the receipt wholly there or wholly absent', { timeout: 300_000 }, async () => {
    // One undisturbed receipt measures how long it takes on this machine.
    const timing = await orderReadyToReceive();
    expect(await stateOf(timing.shopId, timing.orderId)).toEqual(absent);
    const run = startReceiving(timing);
    const started = await run.inside;
    expect(await run.exited, run.output()).toBe(0);
    const fullMs = performance.now() - started;
    expect(await stateOf(timing.shopId, timing.orderId)).toEqual(received);

    const outcomes: string[] = [];
    for (const fraction of [0.3, 0.6, 0.9]) {
      const ready = await orderReadyToReceive();
      const victim = startReceiving(ready);
      await victim.inside;
      await new Promise((r) => setTimeout(r, fullMs * fraction));
      victim.child.kill('SIGKILL');
      await victim.exited;
      const state = await stateOf(ready.shopId, ready.orderId);
      expect(state).toEqual(state.status === 'received' ? received : absent);
      outcomes.push(state.status === 'received' ? 'committed' : 'rolled back');
    }
    // Every kill came after the transaction began; at least one came before its commit, so the
    // test saw a receipt cut short and rolled back — one that only saw finished receipts proves nothing.
    expect(outcomes, `a whole receipt took ${Math.round(fullMs)} ms`).toContain('rolled back');
  });
});
