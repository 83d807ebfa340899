import type { Database } from '../../db/write-lock';
import { createBin, issueStock, receiveStock } from '../stock/stock.service';

/**
 * A bin holding the given parts, received (and for a quantity of 0, issued again) through the stock
 * ledger, so `check:ledger` agrees with it; for label tests and the authorisation matrix. Returns the bin's id.
 */
export async function seedLabelBin(db: Database, shopId: string, code: string, stock: { partId: string; onHand: number }[], description: string | null = null): Promise<string> {
  const ctx = { actor: { userId: null }, at: new Date(Date.UTC(2026, 0, 15)) };
  return db.write(async (manager) => {
    const bin = await createBin(manager, shopId, { code, description }, ctx);
    for (const s of stock) {
      const line = { partId: s.partId, binId: bin.id, condition: 'new' as const };
      // A line at zero (the part has sat here, none left) is one unit received and issued again.
      await receiveStock(manager, shopId, { ...line, quantity: Math.max(s.onHand, 1), unitCostMinor: 100 }, ctx);
      if (s.onHand === 0) await issueStock(manager, shopId, { ...line, quantity: 1 }, ctx);
    }
    return bin.id;
  });
}
