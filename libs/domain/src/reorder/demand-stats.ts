/** Summary of a demand history: one number per period, zero for periods without demand. */
export interface DemandStats {
  /** Number of periods. */
  count: number;
  /** Mean demand per period (d̄); 0 for an empty history. */
  mean: number;
  /**
   * Sample standard deviation (divisor n − 1) per period (σd); null with fewer than two periods,
   * where no spread can be estimated.
   */
  standardDeviation: number | null;
}

/**
 * Mean and sample standard deviation of demand per period. The history is a sample of a demand
 * process whose spread we estimate in order to protect future lead times, so the divisor is n − 1
 * (Bessel's correction); the population formula (divisor n) would understate σ for short histories
 * and so the safety stock. Periods without demand must be passed as 0, or the mean is inflated.
 * Two passes (mean first, then squared deviations) avoid the cancellation of Σx² − n·x̄².
 */
export function demandStats(quantities: readonly number[]): DemandStats {
  for (const quantity of quantities) {
    if (!Number.isFinite(quantity)) throw new RangeError(`Demand must be finite numbers, got ${quantity}`);
  }
  const count = quantities.length;
  if (count === 0) return { count, mean: 0, standardDeviation: null };
  const mean = quantities.reduce((sum, q) => sum + q, 0) / count;
  if (count < 2) return { count, mean, standardDeviation: null };
  const squares = quantities.reduce((sum, q) => sum + (q - mean) * (q - mean), 0);
  return { count, mean, standardDeviation: Math.sqrt(squares / (count - 1)) };
}
