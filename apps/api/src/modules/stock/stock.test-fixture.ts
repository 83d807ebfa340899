import { randomUUID } from 'node:crypto';
import type { Database } from '../../db/write-lock';
import { PartEntity } from '../catalogue/catalogue.entity';
import { createBin, holdStock, receiveStock } from './stock.service';

/** Ids of a small stock made for route tests; holds are handed out one per call so releases can repeat. */
export interface StockFixture {
  partId: string;
  binId: string;
  otherBinId: string;
  nextHoldId(): string;
}

/**
 * Writes a part, two bins and 1,000 units of the part (condition `new`, 2.50 each) into bin A of a
 * shop, and `spare` holds of one unit each, for tests that call every route as every role.
 */
export async function seedStockFixture(db: Database, shopId: string, spare = 10): Promise<StockFixture> {
  const ctx = { actor: { userId: null }, at: new Date(Date.UTC(2026, 0, 15)) };
  const partId = randomUUID();
  return db.write(async (manager) => {
    await manager.insert(PartEntity, { id: partId, shopId, number: 'SX-1000', key: 'SX1000', description: 'Stock fixture part', origin: 'genuine', maker: null, category: 'Fixture', unit: 'each', status: 'available', notes: null, createdAt: ctx.at, updatedAt: ctx.at });
    const bin = await createBin(manager, shopId, { code: 'FX-A', description: 'Fixture bin A' }, ctx);
    const other = await createBin(manager, shopId, { code: 'FX-B', description: 'Fixture bin B' }, ctx);
    await receiveStock(manager, shopId, { partId, binId: bin.id, condition: 'new', quantity: 1000, unitCostMinor: 250 }, ctx);
    const holds: string[] = [];
    for (let i = 0; i < spare; i++) holds.push((await holdStock(manager, shopId, { partId, binId: bin.id, condition: 'new', quantity: 1, purpose: `Fixture hold ${i + 1}` }, ctx)).id);
    return {
      partId,
      binId: bin.id,
      otherBinId: other.id,
      nextHoldId: () => {
        const id = holds.shift();
        if (!id) throw new Error('The stock fixture ran out of spare holds.');
        return id;
      },
    };
  });
}
