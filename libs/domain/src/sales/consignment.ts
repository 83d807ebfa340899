// Consignment settlements (issue 12): what the shop pays a consignor after selling their vehicle.
// Pure maths in integer minor units (decision 007); no I/O.
import { sumMinorUnits, toSafeMinorUnits } from '../money/money';
import { divideRoundHalfAway } from './rounding';

export const consignmentCommissionKinds = ['percent', 'fixed'] as const;
export type ConsignmentCommissionKind = (typeof consignmentCommissionKinds)[number];

/**
 * The commission agreed at intake. A percentage is kept in thousandths of a percent (12.5 % →
 * 12500), like the shop's tax rate, so it stays an exact integer; a fixed commission in minor units.
 */
export type ConsignmentCommission = { kind: 'percent'; milliPercent: number } | { kind: 'fixed'; amountMinor: number };

/** One piece of work the consignor approved, charged against the sale. */
export interface ConsignmentWorkCharge {
  label: string;
  /** What is charged for it, tax included, in minor units (never negative). */
  amountMinor: number;
}

export interface ConsignmentSettlementInput {
  salePriceMinor: number;
  commission: ConsignmentCommission;
  work: readonly ConsignmentWorkCharge[];
}

export interface ConsignmentSettlementFigures {
  salePriceMinor: number;
  commissionMinor: number;
  workMinor: number;
  /** Sale price − commission − work. Negative when the deductions exceed the sale. */
  payoutMinor: number;
  /** What the consignor owes the shop when the payout would be negative; 0 otherwise. */
  consignorOwesMinor: number;
}

function assertAmount(name: string, minor: number): void {
  if (!Number.isSafeInteger(minor) || minor < 0) throw new RangeError(`${name} must be a whole, non-negative number of minor units (got ${minor}).`);
}

/**
 * The shop's commission on a sale. A percentage is `sale × milliPercent / 100 000`, rounded once
 * to minor units with ties away from zero, like every document a customer reads (decision 015):
 * 12.5 % of 1 234 500 is 154 312.5 → 154 313.
 * A fixed commission is the agreed amount, whatever the sale price.
 */
export function consignmentCommission(salePriceMinor: number, commission: ConsignmentCommission): number {
  assertAmount('The sale price', salePriceMinor);
  if (commission.kind === 'fixed') {
    assertAmount('A fixed commission', commission.amountMinor);
    return commission.amountMinor;
  }
  const m = commission.milliPercent;
  if (!Number.isSafeInteger(m) || m < 0 || m > 100_000) throw new RangeError(`A commission percentage is 0 to 100 (got ${m / 1000}).`);
  return toSafeMinorUnits(divideRoundHalfAway(BigInt(salePriceMinor) * BigInt(m), 100_000n));
}

/**
 * The settlement of one consigned vehicle: sale price, less the shop's commission, less the work
 * the consignor approved, is the payout. Nothing is rounded except the percentage commission.
 */
export function consignmentSettlement(input: ConsignmentSettlementInput): ConsignmentSettlementFigures {
  const commissionMinor = consignmentCommission(input.salePriceMinor, input.commission);
  for (const w of input.work) assertAmount(`The work "${w.label}"`, w.amountMinor);
  const workMinor = sumMinorUnits(input.work.map((w) => w.amountMinor));
  const payoutMinor = toSafeMinorUnits(BigInt(input.salePriceMinor) - BigInt(commissionMinor) - BigInt(workMinor));
  return { salePriceMinor: input.salePriceMinor, commissionMinor, workMinor, payoutMinor, consignorOwesMinor: payoutMinor < 0 ? -payoutMinor : 0 };
}

/** Percentage text ("12.5") → thousandths of a percent (12500); null when not 0–100 with ≤ 3 places. */
export function milliPercentOf(text: string | number): number | null {
  const s = String(text).trim();
  const m = /^(\d{1,3})(?:\.(\d{1,3}))?$/.exec(s);
  if (!m) return null;
  const value = Number(m[1]) * 1000 + Number((m[2] ?? '').padEnd(3, '0'));
  return value <= 100_000 ? value : null;
}
