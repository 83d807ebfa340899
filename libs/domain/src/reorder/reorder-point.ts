import { zForServiceLevel } from './normal';

/**
 * How demand during a lead time varies (Stevenson, *Operations Management*, ch. 12, reorder point
 * under uncertainty). Demand and lead time are in the same period unit (days or weeks), and in the
 * 'both_variable' case they are taken as independent.
 */
export type LeadTimeDemandModel =
  /** Demand varies from period to period, the lead time is fixed: σ = σd·√LT. */
  | { kind: 'variable_demand'; meanDemandPerPeriod: number; sdDemandPerPeriod: number; leadTimePeriods: number }
  /** Demand is steady, the lead time varies: σ = d·σLT. */
  | { kind: 'variable_lead_time'; demandPerPeriod: number; meanLeadTimePeriods: number; sdLeadTimePeriods: number }
  /** Both vary: σ = √(L̄T·σd² + d̄²·σLT²). */
  | {
      kind: 'both_variable';
      meanDemandPerPeriod: number;
      sdDemandPerPeriod: number;
      meanLeadTimePeriods: number;
      sdLeadTimePeriods: number;
    }
  /** Mean and spread of the whole lead-time demand are known directly. */
  | { kind: 'lead_time_demand'; meanLeadTimeDemand: number; sdLeadTimeDemand: number };

/**
 * The protection wanted: a cycle service level (probability of no stock-out in a lead time, turned
 * into z exactly), or a z given outright (to reproduce a textbook that used a rounded table value).
 */
export type ServiceTarget = { serviceLevel: number } | { z: number };

/** Mean and standard deviation of the demand during one lead time. */
export interface LeadTimeDemand {
  mean: number;
  sd: number;
}

function nonNegative(name: string, value: number): number {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`${name} must be a finite number ≥ 0, got ${value}`);
  return value;
}

/** Mean and standard deviation of lead-time demand under one of Stevenson's three models (or given). */
export function leadTimeDemand(model: LeadTimeDemandModel): LeadTimeDemand {
  switch (model.kind) {
    case 'variable_demand': {
      const d = nonNegative('meanDemandPerPeriod', model.meanDemandPerPeriod);
      const sd = nonNegative('sdDemandPerPeriod', model.sdDemandPerPeriod);
      const lt = nonNegative('leadTimePeriods', model.leadTimePeriods);
      return { mean: d * lt, sd: sd * Math.sqrt(lt) };
    }
    case 'variable_lead_time': {
      const d = nonNegative('demandPerPeriod', model.demandPerPeriod);
      const lt = nonNegative('meanLeadTimePeriods', model.meanLeadTimePeriods);
      const sdLt = nonNegative('sdLeadTimePeriods', model.sdLeadTimePeriods);
      return { mean: d * lt, sd: d * sdLt };
    }
    case 'both_variable': {
      const d = nonNegative('meanDemandPerPeriod', model.meanDemandPerPeriod);
      const sd = nonNegative('sdDemandPerPeriod', model.sdDemandPerPeriod);
      const lt = nonNegative('meanLeadTimePeriods', model.meanLeadTimePeriods);
      const sdLt = nonNegative('sdLeadTimePeriods', model.sdLeadTimePeriods);
      return { mean: d * lt, sd: Math.sqrt(lt * sd * sd + d * d * sdLt * sdLt) };
    }
    case 'lead_time_demand':
      return {
        mean: nonNegative('meanLeadTimeDemand', model.meanLeadTimeDemand),
        sd: nonNegative('sdLeadTimeDemand', model.sdLeadTimeDemand),
      };
  }
}

/** The z of a service target: exact inverse normal of the level, or the z given. */
export function zOf(target: ServiceTarget): number {
  if ('z' in target) {
    if (!Number.isFinite(target.z)) throw new RangeError('z must be finite');
    return target.z;
  }
  return zForServiceLevel(target.serviceLevel);
}

/**
 * Safety stock z·σ, where σ is the standard deviation of lead-time demand under `model`. Not rounded.
 * A service level below 50 % gives a negative z and so a negative safety stock, as the formula says.
 */
export function safetyStock(model: LeadTimeDemandModel, target: ServiceTarget): number {
  return zOf(target) * leadTimeDemand(model).sd;
}

/**
 * Reorder point: expected lead-time demand plus safety stock, e.g. for variable demand
 * d̄·LT + z·σd·√LT. Order when the stock position falls to it. Not rounded.
 */
export function reorderPoint(model: LeadTimeDemandModel, target: ServiceTarget): number {
  const { mean, sd } = leadTimeDemand(model);
  return mean + zOf(target) * sd;
}
