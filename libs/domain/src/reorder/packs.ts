/** How a supplier sells a part: in packs of `packSize` units, with a minimum order in units. */
export interface PackRule {
  /** Units per pack; a positive whole number (1 when sold singly). */
  packSize: number;
  /** Minimum order quantity in units; 0 when there is none. */
  minOrderQty?: number;
}

/** An order quantity in whole packs. */
export interface PackedQuantity {
  /** Units ordered: packs × packSize. */
  quantity: number;
  /** Number of packs. */
  packs: number;
}

/**
 * Rounds a wanted quantity up to what can be ordered: at least the minimum order quantity, then up
 * to whole packs (a minimum that is not a whole number of packs is rounded up too). Nothing wanted
 * (zero or less) orders nothing, whatever the minimum.
 */
export function roundToPacks(wanted: number, { packSize, minOrderQty = 0 }: PackRule): PackedQuantity {
  if (!Number.isInteger(packSize) || packSize < 1) throw new RangeError('packSize must be a whole number ≥ 1');
  if (!Number.isFinite(minOrderQty) || minOrderQty < 0) throw new RangeError('minOrderQty must be ≥ 0');
  if (!Number.isFinite(wanted)) throw new RangeError('wanted must be a finite number');
  if (wanted <= 0) return { quantity: 0, packs: 0 };
  const units = Math.max(wanted, minOrderQty);
  const packs = Math.ceil(units / packSize);
  return { quantity: packs * packSize, packs };
}
