/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own entities (see demo.ts) */
import { seededRandom } from '@tappet/domain';
import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { PurchaseOrderStatus } from '@tappet/contracts';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { convertMinorUnits } from '../apps/api/src/modules/purchasing/money';
import { ListingEntity, PartPurchasingEntity, PurchaseOrderEntity, PurchaseOrderLineEntity, PurchaseReceiptEntity, SupplierEntity, SupplierReturnEntity, type ListingRow, type PurchaseOrderLineRow, type SupplierRow } from '../apps/api/src/modules/purchasing/purchasing.entity';
import { adjustStock, receiveStock } from '../apps/api/src/modules/stock/stock.service';

// Invented purchasing for Harbour Works: the three suppliers whose numbers the demo catalogue
// already carries, their listings (the parts with their numbers, and every part the shop issues),
// orders in every state (with receipts into bins through the stock module), a return awaiting
// its credit and a core deposit. Everything is dated back from the seed day.

const DAY = 86_400_000;

/** The same draws for the same seed, so every seed gives the same purchasing data. */
const prng = seededRandom;

const supplierSpecs = [
  { name: 'Marrick Spares', email: 'orders@marrick-spares.test', currency: 'GBP', leadTimeDays: 7, leadTimeSdDays: 2, minOrderValueMinor: 15_000, notes: 'Next-day dispatch on stocked lines; phone orders before noon.' },
  { name: 'Hollin Pattern Co.', email: 'sales@hollin-pattern.test', currency: 'GBP', leadTimeDays: 10, leadTimeSdDays: null, minOrderValueMinor: 0, notes: null },
  { name: 'Tarnwell Reproductions', email: 'trade@tarnwell-reproductions.test', currency: 'EUR', leadTimeDays: 21, leadTimeSdDays: 5, minOrderValueMinor: 25_000, notes: 'Reproductions made to order; ships from the continent.' },
] as const;

/** The exchange rate entered on the demo's euro orders: pounds per euro. */
const EUR_RATE = '0.8571';

/**
 * Seeds Harbour Works' purchasing. Call after the catalogue and stock seeds, inside their
 * transaction (`manager`); `users` are the people the orders and approvals are attributed to.
 */
export async function seedPurchasingDemo(manager: EntityManager, shopId: string, users: { owner: string; buyer: string }, now: Date): Promise<void> {
  const rng = prng(8);
  const at = (daysAgo: number) => new Date(now.getTime() - daysAgo * DAY);
  const created = at(120);
  const suppliers: SupplierRow[] = supplierSpecs.map((s) => ({
    id: randomUUID(),
    shopId,
    name: s.name,
    nameKey: s.name.toLowerCase(),
    email: s.email,
    currency: s.currency,
    leadTimeDays: s.leadTimeDays,
    leadTimeSdDays: s.leadTimeSdDays,
    minOrderValueMinor: s.minOrderValueMinor,
    notes: s.notes,
    active: true,
    createdAt: created,
    updatedAt: created,
  }));
  await manager.insert(SupplierEntity, suppliers);
  for (const s of suppliers) await recordAudit(manager, { shopId, actor: { userId: users.buyer }, action: 'supplier.created', entity: 'supplier', entityId: s.id, changes: { name: { before: null, after: s.name } }, at: created });

  // Listings: each supplier's own numbers, then every part the shop issues or stocks (spread over
  // the three), priced near the part's average cost.
  // The catalogue's reproductions are made by these suppliers (their maker), some with a catalogue number of the supplier's own.
  const numbered = await manager.query<Array<{ partId: string; maker: string; number: string; own: string | null }>>(
    `SELECT p.id AS partId, p.maker, p.number, (SELECT s.number FROM part_supplier_numbers s WHERE s.shop_id = p.shop_id AND s.part_id = p.id ORDER BY s.key LIMIT 1) AS own
     FROM parts p WHERE p.shop_id = ? AND p.maker IN (?, ?, ?) ORDER BY p.key`,
    [shopId, ...supplierSpecs.map((x) => x.name)],
  );
  const costs = new Map(
    (await manager.query<Array<{ partId: string; q: number; v: number }>>(`SELECT part_id AS partId, SUM(quantity) AS q, SUM(value_minor) AS v FROM stock_pools WHERE shop_id = ? AND condition IN ('new', 'nos') GROUP BY part_id`, [shopId])).map((r) => [
      r.partId,
      Number(r.q) > 0 ? Math.round(Number(r.v) / Number(r.q)) : 0,
    ]),
  );
  const moving = await manager.query<Array<{ partId: string }>>(
    `SELECT m.part_id AS partId FROM stock_movements m JOIN parts p ON p.shop_id = m.shop_id AND p.id = m.part_id WHERE m.shop_id = ? AND m.kind = 'issued' AND p.status = 'available' GROUP BY m.part_id, p.key ORDER BY p.key`,
    [shopId],
  );
  const listings = new Map<string, ListingRow>();
  const price = (partId: string, currency: string) => {
    const base = costs.get(partId) || 300 + Math.floor(rng() * 4000);
    const gbp = Math.round(base * (1 + rng() * 0.15));
    return currency === 'EUR' ? Math.round(gbp / Number(EUR_RATE)) : gbp;
  };
  const addListing = (supplier: SupplierRow, partId: string, supplierNumber: string | null) => {
    const key = `${supplier.id}|${partId}`;
    if (listings.has(key)) return;
    const pack = rng() < 0.2 ? [2, 5, 10][Math.floor(rng() * 3)]! : 1;
    listings.set(key, {
      id: randomUUID(),
      shopId,
      supplierId: supplier.id,
      partId,
      supplierNumber,
      priceMinor: price(partId, supplier.currency),
      packSize: pack,
      minOrderQty: pack > 1 && rng() < 0.5 ? pack * 2 : 0,
      leadTimeDays: rng() < 0.1 ? supplier.leadTimeDays + 7 : null,
      lastPaidUnitMinor: null,
      lastPaidAt: null,
      createdAt: created,
      updatedAt: created,
    });
  };
  for (const n of numbered) {
    const supplier = suppliers.find((x) => x.name === n.maker);
    if (supplier) addListing(supplier, n.partId, n.own ?? n.number);
  }
  moving.forEach((m, i) => addListing(suppliers[i % 3 === 2 ? 1 : 0]!, m.partId, null));
  const rows = [...listings.values()];
  for (let i = 0; i < rows.length; i += 200) await manager.insert(ListingEntity, rows.slice(i, i + 200));
  await recordAudit(manager, { shopId, actor: { userId: users.buyer }, action: 'supplier_listings.imported', entity: 'import', entityId: null, changes: { added: { before: null, after: rows.length } }, at: created });

  // Preferred suppliers for parts listed twice, and a manual min/max on a few parts.
  const byPart = new Map<string, ListingRow[]>();
  for (const l of rows) byPart.set(l.partId, [...(byPart.get(l.partId) ?? []), l]);
  let manual = 0;
  for (const [partId, list] of byPart) {
    const preferred = list.length > 1 ? list[0]!.supplierId : null;
    const withMinMax = manual < 4 && list[0]!.supplierNumber !== null;
    if (!preferred && !withMinMax) continue;
    if (withMinMax) manual++;
    await manager.insert(PartPurchasingEntity, { shopId, partId, preferredSupplierId: preferred, minQty: withMinMax ? 2 : null, maxQty: withMinMax ? 6 : null, updatedAt: created });
  }

  // Orders in every state.
  const [bin] = await manager.query<Array<{ id: string }>>(`SELECT id FROM stock_bins WHERE shop_id = ? AND active = 1 ORDER BY code_key LIMIT 1`, [shopId]);
  const [row] = await manager.query<Array<{ n: number }>>(`SELECT COALESCE(MAX(number), 0) AS n FROM purchase_orders WHERE shop_id = ?`, [shopId]);
  let number = Number(row?.n ?? 0);
  const bySupplier = (s: SupplierRow) => rows.filter((l) => l.supplierId === s.id);
  const ctx = (daysAgo: number) => ({ actor: { userId: users.buyer }, at: at(daysAgo), occurredAt: at(daysAgo) });

  async function order(supplier: SupplierRow, status: PurchaseOrderStatus, daysAgo: number, lineCount: number, quantity: (i: number) => number, extra: { note?: string; rejection?: string; closed?: string; coreDepositMinor?: number } = {}) {
    const id = randomUUID();
    const pool = bySupplier(supplier);
    if (pool.length === 0) throw new Error(`purchasing demo: ${supplier.name} lists nothing`);
    const picks = Array.from({ length: Math.min(lineCount, pool.length) }, (_, i) => pool[(number * 3 + i) % pool.length]!);
    const lines: PurchaseOrderLineRow[] = picks.map((l, i) => ({
      id: randomUUID(),
      shopId,
      orderId: id,
      position: i + 1,
      partId: l.partId,
      supplierNumber: l.supplierNumber,
      description: 'Demo line',
      quantity: Math.max(l.minOrderQty, Math.ceil(quantity(i) / l.packSize) * l.packSize),
      receivedQuantity: 0,
      cancelledQuantity: 0,
      unitPriceMinor: l.priceMinor,
      coreDepositMinor: i === 0 ? (extra.coreDepositMinor ?? 0) : 0,
      purpose: null,
      specialOrderId: null,
    }));
    for (const line of lines) {
      const [p] = await manager.query<Array<{ description: string }>>(`SELECT description FROM parts WHERE shop_id = ? AND id = ?`, [shopId, line.partId]);
      line.description = p?.description ?? line.description;
    }
    const totalMinor = lines.reduce((s, l) => s + l.quantity * (l.unitPriceMinor + l.coreDepositMinor), 0);
    const rate = supplier.currency === 'EUR' ? EUR_RATE : '1';
    const placed = at(daysAgo);
    const sentStates: PurchaseOrderStatus[] = ['sent', 'partly_received', 'received', 'closed'];
    await manager.insert(PurchaseOrderEntity, {
      id,
      shopId,
      number: ++number,
      supplierId: supplier.id,
      status,
      currency: supplier.currency,
      exchangeRate: rate,
      totalMinor,
      totalShopMinor: convertMinorUnits(totalMinor, rate, supplier.currency, 'GBP'),
      note: extra.note ?? null,
      createdByUserId: users.buyer,
      approvalRequestedAt: ['awaiting_approval', 'approved'].includes(status) ? placed : null,
      approvedByUserId: status === 'approved' ? users.owner : null,
      approvedAt: status === 'approved' ? placed : null,
      rejectionReason: extra.rejection ?? null,
      sentAt: sentStates.includes(status) ? placed : null,
      closedReason: extra.closed ?? null,
      closedAt: status === 'cancelled' || status === 'closed' ? at(Math.max(0, daysAgo - 5)) : null,
      createdAt: placed,
      updatedAt: placed,
    });
    await manager.insert(PurchaseOrderLineEntity, lines);
    await recordAudit(manager, { shopId, actor: { userId: users.buyer }, action: 'purchase_order.created', entity: 'purchase_order', entityId: id, changes: { status: { before: null, after: status }, totalMinor: { before: null, after: totalMinor } }, at: placed });
    return { id, lines, rate, supplier };
  }

  /** Receives `share` of each line (at least one) into the first bin, through the stock module. */
  async function receive(o: Awaited<ReturnType<typeof order>>, share: number, daysAgo: number) {
    for (const line of o.lines) {
      const quantity = Math.max(1, Math.floor(line.quantity * share));
      const unitCost = convertMinorUnits(line.unitPriceMinor, o.rate, o.supplier.currency, 'GBP');
      const [movement] = await receiveStock(manager, shopId, { partId: line.partId, binId: bin!.id, condition: 'new', quantity, unitCostMinor: unitCost, reference: `PO-${String(number).padStart(6, '0')}` }, ctx(daysAgo));
      await manager.insert(PurchaseReceiptEntity, { id: randomUUID(), shopId, orderId: o.id, lineId: line.id, binId: bin!.id, condition: 'new', quantity, unitPriceMinor: line.unitPriceMinor, unitCostShopMinor: unitCost, movementId: movement?.id ?? null, userId: users.buyer, receivedAt: at(daysAgo) });
      await manager.update(PurchaseOrderLineEntity, { shopId, id: line.id }, { receivedQuantity: quantity });
      await manager.update(ListingEntity, { shopId, supplierId: o.supplier.id, partId: line.partId }, { lastPaidUnitMinor: unitCost, lastPaidAt: at(daysAgo) });
      line.receivedQuantity = quantity;
    }
  }

  const [marrick, hollin, tarnwell] = suppliers as [SupplierRow, SupplierRow, SupplierRow];
  await order(marrick, 'draft', 1, 3, (i) => 2 + i, { note: 'Top-up for the spring recommissioning season.' });
  await order(hollin, 'draft', 6, 2, () => 4, { rejection: 'Split this: half now, half once the Corran frames are in.' });
  await order(marrick, 'awaiting_approval', 2, 4, (i) => 10 + i * 5);
  await order(tarnwell, 'approved', 3, 2, () => 6, { note: 'Reproduction rectifiers, made to order.' });
  await order(hollin, 'sent', 4, 3, () => 3);
  const partly = await order(marrick, 'partly_received', 12, 3, () => 8);
  await receive(partly, 0.5, 5);
  const received = await order(hollin, 'received', 30, 2, () => 4, { coreDepositMinor: 2_500 });
  await receive(received, 1, 24);
  const closed = await order(tarnwell, 'closed', 60, 2, () => 6, { closed: 'Maker has stopped the run; the rest will not come.' });
  await receive(closed, 0.5, 40);
  for (const l of closed.lines) await manager.update(PurchaseOrderLineEntity, { shopId, id: l.id }, { cancelledQuantity: l.quantity - l.receivedQuantity });
  await order(marrick, 'cancelled', 45, 1, () => 2, { closed: 'Found two on the shelf in the back store.' });

  // A faulty part going back, awaiting its credit, and the core of the received order's first line.
  const faulty = received.lines[0]!;
  await adjustStock(manager, shopId, { partId: faulty.partId, binId: bin!.id, condition: 'new', quantityDelta: -1, reason: `Returned to ${hollin.name}: casting porous`, reference: 'supplier return' }, ctx(20));
  const ret = (kind: 'return' | 'core', quantity: number, expected: number, reason: string, credited: boolean) => ({
    id: randomUUID(),
    shopId,
    kind,
    supplierId: hollin.id,
    orderId: received.id,
    lineId: faulty.id,
    partId: faulty.partId,
    binId: kind === 'return' ? bin!.id : null,
    condition: kind === 'return' ? 'new' : null,
    quantity,
    reason,
    expectedCreditMinor: expected,
    currency: hollin.currency,
    status: credited ? ('credited' as const) : ('open' as const),
    creditedMinor: credited ? expected : null,
    creditReference: credited ? 'CN-2231' : null,
    creditedAt: credited ? at(10) : null,
    createdByUserId: users.buyer,
    createdAt: at(20),
  });
  await manager.insert(SupplierReturnEntity, [ret('return', 1, faulty.unitPriceMinor, 'Casting porous: weeps oil at the joint face.', false), ret('core', 1, 2_500, 'Old unit back for its exchange deposit.', true)]);
}
