import type { EntityManager } from 'typeorm';
import { defaultPricingRules, sellPrice, type PricingRules, type SellPrice } from '@tappet/domain';
import { pricingRulesSchema } from '@tappet/contracts';

// Sell prices of parts (issue 12). The maths is libs/domain/src/sales (sellPrice); this file only
// gathers its inputs for one shop: the stored pricing rules (sales_settings), each part's list
// price (part_prices, nullable), its category and origin (parts) and its unit cost from the stock
// valuation. Estimates and invoices call these inside their own reads or writes, so they take the
// EntityManager of the caller (db.reader, or the manager of a db.write).

const marks = (n: number) => Array.from({ length: n }, () => '?').join(', ');

/** The shop's pricing rules: what the owner saved, or the defaults. Unknown or damaged JSON falls back to the defaults. */
export async function pricingRulesFor(manager: EntityManager, shopId: string): Promise<PricingRules> {
  const [row] = await manager.query<Array<{ rules: string | null }>>(`SELECT pricing_rules AS rules FROM sales_settings WHERE shop_id = ?`, [shopId]);
  if (!row?.rules) return defaultPricingRules;
  try {
    const parsed = pricingRulesSchema.safeParse(JSON.parse(row.rules));
    return parsed.success ? (parsed.data as PricingRules) : defaultPricingRules;
  } catch {
    return defaultPricingRules;
  }
}

export interface PartPricingFacts {
  listPriceMinor: number | null;
  /** Moving-average unit cost of what is on hand (all conditions pooled), else the last receipt's unit cost; null when never received. */
  unitCostMinor: number | null;
  category: string | null;
  origin: string | null;
}

/** Half away from zero on a non-negative ratio of integers, exactly. */
function divideRounded(value: number, quantity: number): number {
  return Number((2n * BigInt(value) + BigInt(quantity)) / (2n * BigInt(quantity)));
}

/**
 * The pricing inputs of each part (parts of another shop, or unknown ids, are left out).
 * Unit cost: the pools' value over their quantity (moving average, decision 013; serialised items
 * at their own costs), so one figure per part whatever its condition; with nothing on hand, the
 * unit cost of the latest receipt.
 */
export async function pricingFactsFor(manager: EntityManager, shopId: string, partIds: readonly string[]): Promise<Map<string, PartPricingFacts>> {
  const out = new Map<string, PartPricingFacts>();
  const ids = [...new Set(partIds)];
  for (let i = 0; i < ids.length; i += 400) {
    const chunk = ids.slice(i, i + 400);
    const rows = await manager.query<Array<{ id: string; category: string | null; origin: string | null; listPrice: number | null; quantity: number | null; value: number | null }>>(
      `SELECT p.id, p.category, p.origin, pp.list_price_minor AS listPrice,
         (SELECT SUM(sp.quantity) FROM stock_pools sp WHERE sp.shop_id = p.shop_id AND sp.part_id = p.id) AS quantity,
         (SELECT SUM(sp.value_minor) FROM stock_pools sp WHERE sp.shop_id = p.shop_id AND sp.part_id = p.id) AS value
       FROM parts p LEFT JOIN part_prices pp ON pp.shop_id = p.shop_id AND pp.part_id = p.id
       WHERE p.shop_id = ? AND p.id IN (${marks(chunk.length)})`,
      [shopId, ...chunk],
    );
    const withoutStock: string[] = [];
    for (const r of rows) {
      const quantity = Number(r.quantity ?? 0);
      const unitCostMinor = quantity > 0 ? divideRounded(Number(r.value ?? 0), quantity) : null;
      if (unitCostMinor === null) withoutStock.push(r.id);
      out.set(r.id, { listPriceMinor: r.listPrice === null ? null : Number(r.listPrice), unitCostMinor, category: r.category, origin: r.origin });
    }
    if (withoutStock.length > 0) {
      const receipts = await manager.query<Array<{ partId: string; quantity: number; value: number }>>(
        `SELECT m.part_id AS partId, m.quantity_delta AS quantity, m.value_change_minor AS value FROM stock_movements m
         WHERE m.shop_id = ? AND m.kind = 'received' AND m.part_id IN (${marks(withoutStock.length)})
           AND m.seq = (SELECT MAX(m2.seq) FROM stock_movements m2 WHERE m2.shop_id = m.shop_id AND m2.part_id = m.part_id AND m2.kind = 'received')`,
        [shopId, ...withoutStock],
      );
      for (const r of receipts) {
        const facts = out.get(r.partId);
        if (facts && Number(r.quantity) > 0) facts.unitCostMinor = divideRounded(Math.max(0, Number(r.value)), Number(r.quantity));
      }
    }
  }
  return out;
}

/**
 * The sell price of each part under the shop's rules (libs/domain sellPrice). Unknown ids and
 * other shops' parts are absent from the map; a part with neither list price nor cost has
 * `unitMinor: null` (basis 'no-price').
 */
export async function sellPricesFor(manager: EntityManager, shopId: string, partIds: readonly string[]): Promise<Map<string, SellPrice>> {
  const rules = await pricingRulesFor(manager, shopId);
  const facts = await pricingFactsFor(manager, shopId, partIds);
  const out = new Map<string, SellPrice>();
  for (const [id, f] of facts) out.set(id, sellPrice(f, rules));
  return out;
}
