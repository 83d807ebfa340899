/**
 * GS1 check digits (GS1 General Specifications §7.9.1) for the keys a shop meets on supplier
 * barcodes: GTIN-8, GTIN-12 (UPC-A), GTIN-13 (EAN-13), GTIN-14 and SSCC-18 (pallet labels).
 */

/** The GS1 key a code's length identifies. */
export type Gs1Kind = 'GTIN-8' | 'GTIN-12' | 'GTIN-13' | 'GTIN-14' | 'SSCC-18';

/** The outcome of validateGs1; `expected` is the check digit the other digits call for. */
export type Gs1Validation =
  | { ok: true; kind: Gs1Kind }
  | { ok: false; reason: 'length' | 'bad_character' | 'check_digit'; expected?: string };

const KIND_BY_LENGTH: Readonly<Record<number, Gs1Kind>> = {
  8: 'GTIN-8',
  12: 'GTIN-12',
  13: 'GTIN-13',
  14: 'GTIN-14',
  18: 'SSCC-18',
};

/**
 * The check digit for a GS1 key given without it (7, 11, 12, 13 or 17 digits). Weights 3, 1, 3, 1…
 * run from the digit next to the check digit leftwards; the check digit is (10 − sum mod 10) mod 10.
 * Returns null when the input is not digits of one of those lengths.
 */
export function gs1CheckDigit(digits: string): string | null {
  if (!/^\d+$/.test(digits) || KIND_BY_LENGTH[digits.length + 1] === undefined) return null;
  let sum = 0;
  for (let fromRight = 0; fromRight < digits.length; fromRight++) {
    const digit = digits.charCodeAt(digits.length - 1 - fromRight) - 48;
    sum += digit * (fromRight % 2 === 0 ? 3 : 1);
  }
  return String((10 - (sum % 10)) % 10);
}

/**
 * Validates a complete GS1 code (check digit last): its length names the kind (8, 12, 13, 14 or 18
 * digits), then the check digit must match. Whitespace is not stripped: callers trim scanner input.
 */
export function validateGs1(code: string): Gs1Validation {
  if (!/^\d*$/.test(code)) return { ok: false, reason: 'bad_character' };
  const kind = KIND_BY_LENGTH[code.length];
  if (kind === undefined) return { ok: false, reason: 'length' };
  const expected = gs1CheckDigit(code.slice(0, -1));
  // expected is never null here: the code is all digits and its length names a kind.
  if (code.slice(-1) !== expected) return { ok: false, reason: 'check_digit', expected: expected ?? undefined };
  return { ok: true, kind };
}
