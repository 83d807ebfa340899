import type { Database } from '../../db/write-lock';
import { createBin, receiveStock } from '../stock/stock.service';

/**
 * A bin holding the given parts, received through the stock ledger (so `check:ledger` agrees with
 * it), for label tests and the authorisation matrix. Returns the bin's id.
 */
export async function seedLabelBin(db: Database, shopId: string, code: string, stock: { partId: string; onHand: number }[], description: string | null = null): Promise<string> {
  const ctx = { actor: { userId: null }, at: new Date(Date.UTC(2026, 0, 15)) };
  return db.write(async (manager) => {
    const bin = await createBin(manager, shopId, { code, description }, ctx);
    for (const s of stock) await receiveStock(manager, shopId, { partId: s.partId, binId: bin.id, condition: 'new', quantity: s.onHand, unitCostMinor: 100 }, ctx);
    return bin.id;
  });
}
