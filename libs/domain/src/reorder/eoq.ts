/** Inputs of the economic order quantity, in one consistent currency and time unit (a year). */
export interface EoqInput {
  /** D: units demanded per year. */
  annualDemand: number;
  /** S: cost of placing and receiving one order, whatever its size. */
  orderCost: number;
  /** H: cost of holding one unit in stock for a year. */
  holdingCostPerUnitYear: number;
}

function assertInput({ annualDemand, orderCost, holdingCostPerUnitYear }: EoqInput): void {
  if (!(annualDemand >= 0) || !Number.isFinite(annualDemand)) throw new RangeError('annualDemand must be a finite number ≥ 0');
  if (!(orderCost >= 0) || !Number.isFinite(orderCost)) throw new RangeError('orderCost must be a finite number ≥ 0');
  if (!(holdingCostPerUnitYear > 0) || !Number.isFinite(holdingCostPerUnitYear)) {
    throw new RangeError('holdingCostPerUnitYear must be a finite number > 0');
  }
}

/**
 * The economic order quantity Q* = √(2DS / H): the order size at which yearly ordering cost (D/Q)·S
 * equals yearly holding cost (Q/2)·H and their sum is least. Not rounded: round to packs afterwards.
 */
export function eoq(input: EoqInput): number {
  assertInput(input);
  return Math.sqrt((2 * input.annualDemand * input.orderCost) / input.holdingCostPerUnitYear);
}

/**
 * Yearly ordering plus holding cost of ordering `orderQuantity` at a time: (D/Q)·S + (Q/2)·H.
 * Useful to show what rounding an EOQ up to whole packs costs.
 */
export function annualInventoryCost(orderQuantity: number, input: EoqInput): number {
  assertInput(input);
  if (!(orderQuantity > 0)) throw new RangeError('orderQuantity must be > 0');
  return (input.annualDemand / orderQuantity) * input.orderCost + (orderQuantity / 2) * input.holdingCostPerUnitYear;
}
