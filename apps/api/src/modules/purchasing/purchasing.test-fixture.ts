import { randomUUID } from 'node:crypto';
import type { PurchaseOrderStatus } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import { PartEntity } from '../catalogue/catalogue.entity';
import { createBin, receiveStock } from '../stock/stock.service';
import { ListingEntity, PurchaseOrderEntity, PurchaseOrderLineEntity, SupplierEntity, SupplierReturnEntity, type PurchaseOrderRow } from './purchasing.entity';

/** Ids of a small purchasing world for route tests; records that a call uses up are handed out one per call. */
/** A purchase order row written straight to the database, in GBP, as of `at` (no lines). */
export function fixtureOrderRow(o: { shopId: string; number: number; supplierId: string; status: PurchaseOrderStatus; totalMinor: number; at: Date }): PurchaseOrderRow {
  return {
    id: randomUUID(),
    shopId: o.shopId,
    number: o.number,
    supplierId: o.supplierId,
    status: o.status,
    currency: 'GBP',
    exchangeRate: '1',
    totalMinor: o.totalMinor,
    totalShopMinor: o.totalMinor,
    note: null,
    createdByUserId: null,
    approvalRequestedAt: o.status === 'awaiting_approval' ? o.at : null,
    approvedByUserId: null,
    approvedAt: null,
    rejectionReason: null,
    sentAt: o.status === 'sent' ? o.at : null,
    closedReason: null,
    closedAt: null,
    createdAt: o.at,
    updatedAt: o.at,
  };
}

export interface PurchasingFixture {
  supplierId: string;
  supplierName: string;
  partId: string;
  binId: string;
  listingId: string;
  orderId: string;
  nextDraftId(): string;
  nextAwaitingId(): string;
  nextSentId(): string;
  nextSentLineId(orderId: string): string;
  nextListingId(): string;
  nextReturnId(): string;
  /** A part no supplier lists yet (for a new listing). */
  nextUnlistedPart(): { id: string; number: string };
}

/**
 * Writes a supplier with an e-mail address, a part with a listing and 1,000 in a bin, and spare
 * orders in draft, awaiting approval and sent (each 100 × 10.00 = 1,000.00, above a buyer's
 * default limit), spare listings and open returns.
 */
export async function seedPurchasingFixture(db: Database, shopId: string, spare = 12): Promise<PurchasingFixture> {
  const at = new Date(Date.UTC(2026, 0, 15));
  const part = (number: string) => ({ id: randomUUID(), shopId, number, key: number.replace(/[^A-Z0-9]/g, ''), description: `Purchasing fixture ${number}`, origin: 'genuine' as const, maker: null, category: 'Fixture', unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at });
  const main = part('PF-1000');
  const listed = Array.from({ length: spare }, (_, i) => part(`PF-L${i}`));
  const unlisted = Array.from({ length: spare * 2 }, (_, i) => part(`PF-U${i}`));
  const supplier = { id: randomUUID(), shopId, name: 'Fixture Supplies', nameKey: 'fixture supplies', email: 'orders@fixture-supplies.test', currency: 'GBP', leadTimeDays: 7, leadTimeSdDays: null, minOrderValueMinor: 0, notes: null, active: true, createdAt: at, updatedAt: at };
  const listing = (partId: string) => ({ id: randomUUID(), shopId, supplierId: supplier.id, partId, supplierNumber: null, priceMinor: 1000, packSize: 1, minOrderQty: 0, leadTimeDays: null, lastPaidUnitMinor: null, lastPaidAt: null, createdAt: at, updatedAt: at });
  const mainListing = listing(main.id);
  const spareListings = listed.map((p) => listing(p.id));
  const orders: Record<'draft' | 'awaiting_approval' | 'sent', string[]> = { draft: [], awaiting_approval: [], sent: [] };
  const lines = new Map<string, string>();
  const returns: string[] = [];
  let binId = '';

  await db.write(async (manager) => {
    // A retried write (PostgreSQL) runs again from here: keep only the ids of the attempt that commits.
    for (const list of Object.values(orders)) list.length = 0;
    lines.clear();
    returns.length = 0;
    await manager.insert(PartEntity, [main, ...listed, ...unlisted]);
    await manager.insert(SupplierEntity, supplier);
    await manager.insert(ListingEntity, [mainListing, ...spareListings]);
    const ctx = { actor: { userId: null }, at };
    binId = (await createBin(manager, shopId, { code: 'PF-BIN' }, ctx)).id;
    await receiveStock(manager, shopId, { partId: main.id, binId, condition: 'new', quantity: 1000, unitCostMinor: 1000 }, ctx);
    const [row] = await manager.query<Array<{ n: number }>>(`SELECT COALESCE(MAX(number), 0) AS n FROM purchase_orders WHERE shop_id = ?`, [shopId]);
    let number = Number(row?.n ?? 0);
    for (const status of ['draft', 'awaiting_approval', 'sent'] as const satisfies PurchaseOrderStatus[]) {
      for (let i = 0; i < spare * (status === 'draft' ? 4 : 2); i++) {
        const row = fixtureOrderRow({ shopId, number: ++number, supplierId: supplier.id, status, totalMinor: 100_000, at });
        const { id } = row;
        await manager.insert(PurchaseOrderEntity, row);
        const lineId = randomUUID();
        await manager.insert(PurchaseOrderLineEntity, { id: lineId, shopId, orderId: id, position: 1, partId: main.id, supplierNumber: null, description: main.description, quantity: 100, receivedQuantity: 0, cancelledQuantity: 0, unitPriceMinor: 1000, coreDepositMinor: 0, purpose: null, specialOrderId: null });
        lines.set(id, lineId);
        orders[status].push(id);
      }
    }
    for (let i = 0; i < spare; i++) {
      const id = randomUUID();
      await manager.insert(SupplierReturnEntity, { id, shopId, kind: 'return', supplierId: supplier.id, orderId: null, lineId: null, partId: main.id, binId: null, condition: null, quantity: 1, reason: 'Fixture return', expectedCreditMinor: 1000, currency: 'GBP', status: 'open', creditedMinor: null, creditReference: null, creditedAt: null, createdByUserId: null, createdAt: at });
      returns.push(id);
    }
  });

  const take = <T>(list: T[], what: string) => () => {
    const next = list.shift();
    if (next === undefined) throw new Error(`The purchasing fixture ran out of spare ${what}.`);
    return next;
  };
  const sentPool = [...orders.sent];
  return {
    supplierId: supplier.id,
    supplierName: supplier.name,
    partId: main.id,
    binId,
    listingId: mainListing.id,
    orderId: orders.draft[0]!,
    nextDraftId: take(orders.draft.slice(1), 'drafts'),
    nextAwaitingId: take(orders.awaiting_approval, 'orders awaiting approval'),
    nextSentId: take(sentPool, 'sent orders'),
    nextSentLineId: (orderId) => lines.get(orderId)!,
    nextListingId: take(spareListings.map((l) => l.id), 'listings'),
    nextReturnId: take(returns, 'returns'),
    nextUnlistedPart: take(unlisted.map((p) => ({ id: p.id, number: p.number })), 'unlisted parts'),
  };
}
