/**
 * The standard normal distribution, to the accuracy reorder maths needs and more: the cumulative
 * distribution Φ, and its inverse for turning a cycle service level into a safety factor z.
 */

const SQRT_2PI = Math.sqrt(2 * Math.PI);

/** Standard normal density φ(x). */
function density(x: number): number {
  return Math.exp(-0.5 * x * x) / SQRT_2PI;
}

/**
 * Upper tail Q(t) = 1 − Φ(t) for t ≥ 0, with full relative accuracy far into the tail.
 * Below 3: Φ(t) − ½ = φ(t)·(t + t³/3 + t⁵/(3·5) + …), a series of positive terms.
 * From 3: Q(t) = φ(t) / (t + 1/(t + 2/(t + 3/(t + …)))), Laplace's continued fraction, which
 * converges fast there. (Both are classical; see Abramowitz & Stegun 26.2.10 and 26.2.14.)
 */
function upperTail(t: number): number {
  if (t < 3) {
    let term = t;
    let sum = t;
    for (let k = 1; k < 200 && Math.abs(term) > 1e-17 * Math.abs(sum); k++) {
      term *= (t * t) / (2 * k + 1);
      sum += term;
    }
    return 0.5 - density(t) * sum;
  }
  let fraction = t;
  for (let k = 80; k >= 1; k--) fraction = t + k / fraction;
  return density(t) / fraction;
}

/** The standard normal cumulative distribution Φ(x) = P(Z ≤ x). */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) return Number.NaN;
  return x < 0 ? upperTail(-x) : 1 - upperTail(x);
}

// P. J. Acklam's rational approximations to the inverse normal (relative error below 1.15e-9),
// refined below by one Halley step against the accurate Φ above.
const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239] as const;
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1] as const;
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783] as const;
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416] as const;
const P_LOW = 0.02425;

/** Acklam's approximation for 0 < p ≤ 0.5 (the lower half; the upper half follows by symmetry). */
function acklamLowerHalf(p: number): number {
  if (p < P_LOW) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (((((C[0] * q + C[1]) * q + C[2]) * q + C[3]) * q + C[4]) * q + C[5]) / ((((D[0] * q + D[1]) * q + D[2]) * q + D[3]) * q + 1);
  }
  const q = p - 0.5;
  const r = q * q;
  return ((((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5]) * q) / (((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1);
}

/**
 * The inverse standard normal Φ⁻¹(p): the z with P(Z ≤ z) = p. Accurate to about 1e-15 absolute
 * for 1e-300 < p < 1 − 1e-16. Throws a RangeError outside 0 < p < 1.
 */
export function inverseNormalCdf(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`A probability strictly between 0 and 1 is needed, got ${p}`);
  if (p === 0.5) return 0;
  // Work in the lower half, where Φ(x) = Q(−x) keeps full relative accuracy; 1 − p is exact for p ≥ ½.
  const lower = Math.min(p, 1 - p);
  let x = acklamLowerHalf(lower);
  const error = upperTail(-x) - lower;
  const u = error * SQRT_2PI * Math.exp(0.5 * x * x);
  x -= u / (1 + 0.5 * x * u); // Halley's step
  return p < 0.5 ? x : -x;
}

/**
 * The safety factor z for a cycle service level p (the probability of no stock-out during a lead
 * time): `zForServiceLevel(0.95)` → 1.6448536269514722. Exact to double precision, where printed
 * tables give 1.65 or 1.645. Throws a RangeError unless 0 < p < 1.
 */
export function zForServiceLevel(p: number): number {
  return inverseNormalCdf(p);
}
