import { eoq } from './eoq';
import { roundToPacks, type PackRule } from './packs';
import { leadTimeDemand, zOf, type LeadTimeDemandModel, type ServiceTarget } from './reorder-point';

/** Everything one reorder decision for one current part needs, in days and one currency's minor units. */
export interface ReorderInput {
  /** Mean daily demand d̄ over the window (days without issues counted as 0). */
  meanDemandPerDay: number;
  /** Sample standard deviation of daily demand; null with fewer than two days of history. */
  sdDemandPerDay: number | null;
  /** Mean lead time in days. */
  leadTimeDays: number;
  /** Standard deviation of the lead time in days; null or 0 when it does not vary (or is unknown). */
  sdLeadTimeDays: number | null;
  service: ServiceTarget;
  /** S: cost of placing one order. */
  orderCostMinor: number;
  /** Holding cost as a fraction of unit cost per year (0.25 for 25 %). */
  holdingRatePerYear: number;
  /** Unit cost in the same currency as the ordering cost; null when unknown (no EOQ then). */
  unitCostMinor: number | null;
  /** Stock position: free stock + on order + stock of parts that can fill this demand. */
  stockPosition: number;
  pack: PackRule;
  /** A minimum / maximum set by hand, used when the part has no demand history. */
  manual?: { min: number | null; max: number | null };
}

export type ReorderMethod = 'statistical' | 'min_max';

/** A reorder decision with every figure that led to it, so it can explain itself. */
export interface ReorderDecision {
  method: ReorderMethod;
  /** Which of Stevenson's lead-time demand models was used ('none' for min/max). */
  model: LeadTimeDemandModel['kind'] | 'none';
  z: number;
  safetyStock: number;
  reorderPoint: number;
  /** Unrounded economic order quantity; null without a unit cost or a holding rate. */
  eoq: number | null;
  /** Unrounded quantity wanted before packs and minimums. */
  wanted: number;
  /** What to order: whole packs, at least the minimum order quantity; 0 when nothing is due. */
  quantity: number;
  packs: number;
  /** Plain sentences, in order, saying why. */
  reasons: string[];
}

const round2 = (n: number) => Math.round(n * 100) / 100;

/**
 * The lead-time demand model for the data at hand: both variable when demand and lead time both
 * spread (Stevenson, *Operations Management*, ch. 12: σ = √(L̄T·σd² + d̄²·σLT²)), variable lead time
 * when only the lead time spreads (σ = d·σLT), otherwise variable demand (σ = σd·√LT; with no
 * spread known, σd = 0 and the safety stock is nil).
 */
export function leadTimeDemandModel(input: Pick<ReorderInput, 'meanDemandPerDay' | 'sdDemandPerDay' | 'leadTimeDays' | 'sdLeadTimeDays'>): LeadTimeDemandModel {
  const sd = input.sdDemandPerDay ?? 0;
  const sdLt = input.sdLeadTimeDays ?? 0;
  if (sdLt > 0 && sd > 0) {
    return { kind: 'both_variable', meanDemandPerPeriod: input.meanDemandPerDay, sdDemandPerPeriod: sd, meanLeadTimePeriods: input.leadTimeDays, sdLeadTimePeriods: sdLt };
  }
  if (sdLt > 0) return { kind: 'variable_lead_time', demandPerPeriod: input.meanDemandPerDay, meanLeadTimePeriods: input.leadTimeDays, sdLeadTimePeriods: sdLt };
  return { kind: 'variable_demand', meanDemandPerPeriod: input.meanDemandPerDay, sdDemandPerPeriod: sd, leadTimePeriods: input.leadTimeDays };
}

/**
 * Decides whether and how much to reorder of one part, in a continuous-review (reorder point,
 * order quantity) policy:
 * - with demand history: safety stock z·σ and reorder point d̄·L̄T + z·σ from the lead-time demand
 *   model; when the stock position is at or below the reorder point, order the larger of the EOQ
 *   √(2DS/H) (D = 365·d̄, H = unit cost × holding rate) and what lifts the position back to the
 *   reorder point;
 * - without history but with a manual minimum: order up to the maximum (or the minimum) once the
 *   position is at or below the minimum;
 * then round up to whole packs and the minimum order quantity. Returns null when the part has
 * neither history nor a manual minimum (nothing to base a decision on).
 */
export function decideReorder(input: ReorderInput): ReorderDecision | null {
  const reasons: string[] = [];
  const position = input.stockPosition;
  const hasDemand = input.meanDemandPerDay > 0;
  if (!hasDemand) {
    const min = input.manual?.min ?? null;
    if (min === null) return null;
    const target = input.manual?.max ?? min;
    reasons.push(`No issues in the window; the minimum of ${min} and maximum of ${target} set by hand apply.`);
    const due = position <= min;
    const wanted = due ? Math.max(0, target - position) : 0;
    reasons.push(due ? `The stock position ${round2(position)} is at or below the minimum: order up to ${target}, ${round2(wanted)} wanted.` : `The stock position ${round2(position)} is above the minimum: nothing to order.`);
    const packed = roundToPacks(wanted, input.pack);
    if (packed.quantity !== wanted && packed.quantity > 0) reasons.push(packReason(wanted, packed.quantity, input.pack));
    return { method: 'min_max', model: 'none', z: 0, safetyStock: 0, reorderPoint: min, eoq: null, wanted, ...packed, reasons };
  }

  const model = leadTimeDemandModel(input);
  const z = zOf(input.service);
  const ltd = leadTimeDemand(model);
  const safetyStock = Math.max(0, z * ltd.sd);
  const reorderPoint = ltd.mean + safetyStock;
  reasons.push(`Demand averages ${round2(input.meanDemandPerDay)} a day${input.sdDemandPerDay === null ? '' : ` (standard deviation ${round2(input.sdDemandPerDay)})`}; over a lead time of ${round2(input.leadTimeDays)} days${input.sdLeadTimeDays ? ` (± ${round2(input.sdLeadTimeDays)})` : ''} that is ${round2(ltd.mean)}.`);
  reasons.push(`Safety stock z·σ = ${round2(z)} × ${round2(ltd.sd)} = ${round2(safetyStock)} (${modelWords(model.kind)}); reorder point ${round2(reorderPoint)}.`);

  const annualDemand = input.meanDemandPerDay * 365;
  const holding = input.unitCostMinor === null ? 0 : input.unitCostMinor * input.holdingRatePerYear;
  const rawEoq = holding > 0 ? eoq({ annualDemand, orderCost: input.orderCostMinor, holdingCostPerUnitYear: holding }) : null;
  // A holding cost too small to divide by gives no usable EOQ.
  const q = rawEoq !== null && Number.isFinite(rawEoq) ? rawEoq : null;
  if (q !== null) reasons.push(`Economic order quantity √(2·${round2(annualDemand)}·${input.orderCostMinor}/${round2(holding)}) = ${round2(q)} (yearly demand, ordering cost and holding cost a unit a year, in minor units).`);
  else reasons.push('No unit cost or holding rate is known, so there is no economic order quantity: the order only lifts the stock back to the reorder point.');

  if (position > reorderPoint) {
    reasons.push(`The stock position ${round2(position)} is above the reorder point: nothing to order yet.`);
    return { method: 'statistical', model: model.kind, z, safetyStock, reorderPoint, eoq: q, wanted: 0, quantity: 0, packs: 0, reasons };
  }
  const toReorderPoint = reorderPoint - position;
  const wanted = Math.max(q ?? 0, toReorderPoint, Number.MIN_VALUE);
  reasons.push(
    q !== null && q >= toReorderPoint
      ? `The stock position ${round2(position)} is at or below the reorder point: order the economic order quantity, ${round2(q)}.`
      : `The stock position ${round2(position)} is at or below the reorder point: order ${round2(toReorderPoint)} to lift it back${q !== null ? ', more than the economic order quantity' : ''}.`,
  );
  const packed = roundToPacks(wanted, input.pack);
  if (packed.quantity !== wanted) reasons.push(packReason(wanted, packed.quantity, input.pack));
  return { method: 'statistical', model: model.kind, z, safetyStock, reorderPoint, eoq: q, wanted, ...packed, reasons };
}

function modelWords(kind: LeadTimeDemandModel['kind']): string {
  switch (kind) {
    case 'both_variable':
      return 'demand and lead time both vary';
    case 'variable_lead_time':
      return 'the lead time varies';
    case 'variable_demand':
      return 'demand varies, the lead time is fixed';
    default:
      return 'lead-time demand given';
  }
}

function packReason(wanted: number, quantity: number, pack: PackRule): string {
  const parts = [`packs of ${pack.packSize}`];
  if (pack.minOrderQty) parts.push(`a minimum order of ${pack.minOrderQty}`);
  return `Rounded up from ${round2(wanted)} to ${quantity} for ${parts.join(' and ')}.`;
}

/** Stock of another part that can fill some of a current part's demand. */
export interface SubstituteStock {
  /** Units on hand, free, of the other part. */
  free: number;
  /** How many of the other part fill one unit of the current part's demand. */
  unitsPerDemandUnit: number;
  /**
   * 'full': it fills any demand for the current part (a `both` predecessor, an equivalent).
   * 'own_demand_only': a `one_way` predecessor — it fits only where the older number fitted, so it
   * offsets only the demand that came in under that older number (`ownDemand`, in current-part units).
   */
  scope: 'full' | 'own_demand_only';
  ownDemand?: number;
}

/**
 * The supply that other parts add to a current part's stock position, in current-part units: a
 * part that fills any demand counts fully; a one-way predecessor counts only up to the demand that
 * arrived under its own number (over the horizon the caller chose, e.g. the lead time).
 */
export function substituteSupply(stocks: readonly SubstituteStock[]): number {
  let total = 0;
  for (const s of stocks) {
    if (!(s.unitsPerDemandUnit > 0) || !(s.free >= 0)) throw new RangeError('Substitute stock needs free ≥ 0 and unitsPerDemandUnit > 0');
    const units = s.free / s.unitsPerDemandUnit;
    total += s.scope === 'full' ? units : Math.min(units, Math.max(0, s.ownDemand ?? 0));
  }
  return total;
}
