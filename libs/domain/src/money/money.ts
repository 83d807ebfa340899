/**
 * Money in Tappet: the rounding policy.
 *
 * - An amount is an integer count of the currency's minor unit (pence, cents; yen have none),
 *   carried as a JavaScript number that must be a safe integer. Integers add and subtract exactly.
 * - Products and quotients (quantity × unit price, value × issued / on hand) are computed exactly
 *   on BigInt and rounded once, where the exact result becomes an amount, never step by step.
 * - That single rounding is round half to even (a tie goes to the even neighbour: 0.5 → 0,
 *   1.5 → 2, 2.5 → 2). Ties then fall up and down alike, so long sums of rounded lines do not
 *   drift upwards the way round-half-up does.
 * - Parsing never rounds: "12.345" is refused for a currency with two decimals, because a typed
 *   amount that cannot be represented is a data-entry error, not something to round silently.
 */

/** An exact decimal: `coefficient × 10^-scale` (scale ≥ 0). */
export interface ExactDecimal {
  readonly coefficient: bigint;
  readonly scale: number;
}

/** Why a decimal or money text was refused. */
export type MoneyFormatReason = 'not_a_decimal' | 'too_many_decimals' | 'out_of_range';

/** Thrown by the parsers when the input is not an exact amount they can represent. */
export class MoneyFormatError extends Error {
  override readonly name = 'MoneyFormatError';
  constructor(
    readonly reason: MoneyFormatReason,
    readonly input: string,
  ) {
    super(`Cannot read "${input}" as an amount (${reason})`);
  }
}

const DECIMAL_PATTERN = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
const MAX_SAFE = BigInt(Number.MAX_SAFE_INTEGER);

/**
 * Reads a decimal exactly, from text ("12.34", "-0.5", "1e-3") or from a finite number (taken as
 * its shortest round-trip decimal, which is what a person typed: 0.1 → 1/10, not the binary value).
 * Throws MoneyFormatError('not_a_decimal') otherwise.
 */
export function parseDecimal(input: string | number): ExactDecimal {
  const text = typeof input === 'number' ? (Number.isFinite(input) ? String(input) : '') : input;
  const match = DECIMAL_PATTERN.exec(text);
  const [, sign = '', whole = '', fraction = '', exponentText = '0'] = match ?? [];
  if (!match || whole.length + fraction.length === 0) throw new MoneyFormatError('not_a_decimal', String(input));
  const exponent = Number(exponentText);
  let coefficient = BigInt(whole + fraction || '0');
  let scale = fraction.length - exponent;
  if (scale < 0) {
    coefficient *= 10n ** BigInt(-scale);
    scale = 0;
  }
  return { coefficient: sign === '-' ? -coefficient : coefficient, scale };
}

/** The same decimal with `scale` digits after the point, or null if that would drop non-zero digits. */
export function rescale(value: ExactDecimal, scale: number): bigint | null {
  if (scale >= value.scale) return value.coefficient * 10n ** BigInt(scale - value.scale);
  const divisor = 10n ** BigInt(value.scale - scale);
  return value.coefficient % divisor === 0n ? value.coefficient / divisor : null;
}

/**
 * `numerator / denominator` rounded to an integer, ties to even. The one rounding primitive of the
 * policy above; everything that turns an exact ratio into an amount goes through it.
 */
export function divideRoundHalfEven(numerator: bigint, denominator: bigint): bigint {
  if (denominator === 0n) throw new RangeError('Division by zero');
  if (denominator < 0n) return divideRoundHalfEven(-numerator, -denominator);
  const quotient = numerator / denominator; // truncates towards zero
  const remainder = numerator - quotient * denominator;
  if (remainder === 0n) return quotient;
  const twice = 2n * (remainder < 0n ? -remainder : remainder);
  const away = remainder < 0n ? quotient - 1n : quotient + 1n;
  if (twice > denominator) return away;
  if (twice < denominator) return quotient;
  return quotient % 2n === 0n ? quotient : away;
}

/** Converts an exact BigInt amount to a number, refusing anything beyond ±(2^53 − 1). */
export function toSafeMinorUnits(value: bigint, input = String(value)): number {
  if (value > MAX_SAFE || value < -MAX_SAFE) throw new MoneyFormatError('out_of_range', input);
  return Number(value);
}

function assertMinorUnits(minor: number): void {
  if (!Number.isSafeInteger(minor)) throw new RangeError(`Not an integer amount of minor units: ${minor}`);
}

/**
 * Parses an amount written in major units ("12.34", "-5", "0.5") into minor units, exactly.
 * `exponent` is the number of minor-unit digits (2 for GBP/EUR/USD, 0 for JPY, 3 for BHD).
 * Throws MoneyFormatError: 'not_a_decimal', 'too_many_decimals' (never rounds), 'out_of_range'.
 */
export function parseMinorUnits(text: string, exponent = 2): number {
  const trimmed = text.trim();
  if (/[eE]/.test(trimmed)) throw new MoneyFormatError('not_a_decimal', text);
  const minor = rescale(parseDecimal(trimmed), exponent);
  if (minor === null) throw new MoneyFormatError('too_many_decimals', text);
  return toSafeMinorUnits(minor, text);
}

/** Writes minor units as a plain decimal in major units: 1234 → "12.34", -5 → "-0.05" (exponent 2). */
export function formatMinorUnits(minor: number, exponent = 2): string {
  assertMinorUnits(minor);
  const negative = minor < 0;
  const digits = String(Math.abs(minor)).padStart(exponent + 1, '0');
  const whole = digits.slice(0, digits.length - exponent);
  const fraction = digits.slice(digits.length - exponent);
  return `${negative ? '-' : ''}${whole}${exponent > 0 ? `.${fraction}` : ''}`;
}

/** The number of minor-unit digits of an ISO 4217 currency, as the runtime's Intl data knows it. */
export function minorUnitExponent(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/**
 * Formats minor units for people, with the currency's symbol and the locale's separators:
 * `formatMoney(123456, 'GBP', 'en-GB')` → "£1,234.56". The decimal is handed to Intl as text, so
 * large amounts are not pushed through binary floating point.
 */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  const exponent = minorUnitExponent(currency);
  const formatter = new Intl.NumberFormat(locale, { style: 'currency', currency });
  // Intl accepts decimal strings (ECMA-402 "Intl.NumberFormat v3"); the lib types predate it.
  return formatter.format(formatMinorUnits(minor, exponent) as unknown as number);
}

/**
 * Multiplies an amount by a decimal quantity (2.5 litres, "0.333" of a pack) and rounds the exact
 * product to minor units, ties to even: `multiplyMinorUnits(101, '0.5')` → 50 (50.5 → 50).
 */
export function multiplyMinorUnits(minor: number, quantity: string | number): number {
  assertMinorUnits(minor);
  const q = parseDecimal(quantity);
  const product = divideRoundHalfEven(BigInt(minor) * q.coefficient, 10n ** BigInt(q.scale));
  return toSafeMinorUnits(product);
}

/** Adds amounts exactly, refusing a total beyond the safe-integer range. */
export function sumMinorUnits(amounts: readonly number[]): number {
  let total = 0n;
  for (const amount of amounts) {
    assertMinorUnits(amount);
    total += BigInt(amount);
  }
  return toSafeMinorUnits(total);
}
