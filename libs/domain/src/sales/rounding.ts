/**
 * Rounding for documents a customer reads (estimates, invoices, credit notes, settlements):
 * half away from zero, to the minor unit ("commercial rounding": 0.5p → 1p, −0.5p → −1p). It is
 * what people check an invoice with by hand, and what tax authorities describe as rounding to the
 * nearest penny (common practice). Stock valuation keeps round-half-to-even (decision 007); see
 * decision 015 for why documents differ.
 */
export function divideRoundHalfAway(numerator: bigint, denominator: bigint): bigint {
  if (denominator === 0n) throw new RangeError('Division by zero');
  if (denominator < 0n) return divideRoundHalfAway(-numerator, -denominator);
  const quotient = numerator / denominator; // truncates towards zero
  const remainder = numerator - quotient * denominator;
  const twice = 2n * (remainder < 0n ? -remainder : remainder);
  if (twice < denominator) return quotient;
  return remainder < 0n ? quotient - 1n : quotient + 1n;
}
