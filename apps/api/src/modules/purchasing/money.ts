import { divideRoundHalfEven, minorUnitExponent, parseDecimal, toSafeMinorUnits } from '@tappet/domain';

/**
 * Converts an amount in one currency's minor units into another's at a decimal exchange rate
 * (units of `to` per unit of `from`), exactly, rounding once, half to even — the rounding policy of
 * libs/domain/src/money. The currencies' minor-unit exponents are taken into account (JPY has none).
 */
export function convertMinorUnits(minor: number, rate: string, from: string, to: string): number {
  if (!Number.isSafeInteger(minor)) throw new RangeError(`Not an integer amount of minor units: ${minor}`);
  const r = parseDecimal(rate);
  const shift = minorUnitExponent(to) - minorUnitExponent(from);
  const numerator = BigInt(minor) * r.coefficient * 10n ** BigInt(Math.max(0, shift));
  const denominator = 10n ** BigInt(r.scale) * 10n ** BigInt(Math.max(0, -shift));
  return toSafeMinorUnits(divideRoundHalfEven(numerator, denominator));
}
