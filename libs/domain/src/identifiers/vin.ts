/**
 * Vehicle identification numbers: the 17-character VIN (ISO 3779 structure) and its check digit
 * in position 9, as US 49 CFR 565 defines it. Vehicles before model year 1981 carry free-form frame
 * and engine numbers instead, so the check applies only to 17-character identifiers.
 */

/** Transliteration of letters to numbers (49 CFR 565). I, O and Q are never used in a VIN. */
const LETTER_VALUES: Readonly<Record<string, number>> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};

/** Position weights 1–17; position 9 (the check digit itself) weighs 0. */
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2] as const;

const VIN_LENGTH = 17;
const CHECK_POSITION = 8; // zero-based index of position 9

/** Why a VIN was refused. */
export type VinProblem = 'length' | 'illegal_letter' | 'bad_character' | 'check_digit';

/** The outcome of validateVin; `expected` is the check digit the other 16 characters call for. */
export type VinValidation = { ok: true } | { ok: false; reason: VinProblem; expected?: string };

function valueOf(character: string): number | undefined {
  if (character >= '0' && character <= '9') return character.charCodeAt(0) - 48;
  return LETTER_VALUES[character];
}

/**
 * True when the identifier is 17 letters and digits: the shape of a post-1981 VIN, and the only
 * shape the check digit applies to. Frame numbers of older vehicles fail this and are not checked.
 */
export function isSeventeenCharacterVin(identifier: string): boolean {
  return /^[A-Za-z0-9]{17}$/.test(identifier);
}

/**
 * The weighted sum of 49 CFR 565: each character's value times its position weight, over all 17
 * positions (position 9 weighs 0). Case-insensitive. Null unless 17 permitted characters.
 */
export function vinWeightedSum(vin: string): number | null {
  const upper = vin.toUpperCase();
  if (upper.length !== VIN_LENGTH) return null;
  let sum = 0;
  for (let i = 0; i < VIN_LENGTH; i++) {
    const value = valueOf(upper.charAt(i));
    if (value === undefined) return null;
    sum += value * (WEIGHTS[i] ?? 0);
  }
  return sum;
}

/**
 * The check digit ('0'–'9' or 'X') that 49 CFR 565 assigns to a 17-character VIN: the weighted sum
 * mod 11, with 10 written X. Whatever position 9 holds now is ignored. Case-insensitive. Returns
 * null when the input is not 17 permitted characters (digits, and letters other than I, O, Q).
 */
export function vinCheckDigit(vin: string): string | null {
  const sum = vinWeightedSum(vin);
  if (sum === null) return null;
  const remainder = sum % 11;
  return remainder === 10 ? 'X' : String(remainder);
}

/**
 * Validates a 17-character VIN: length, characters (I, O, Q are refused as 'illegal_letter', anything
 * other than A–Z and 0–9 as 'bad_character'), then the check digit in position 9. Lower case is
 * accepted as the same letters. Whitespace is not stripped: callers trim what a person typed.
 */
export function validateVin(vin: string): VinValidation {
  const upper = vin.toUpperCase();
  if (upper.length !== VIN_LENGTH) return { ok: false, reason: 'length' };
  if (/[^A-Z0-9]/.test(upper)) return { ok: false, reason: 'bad_character' };
  if (/[IOQ]/.test(upper)) return { ok: false, reason: 'illegal_letter' };
  const expected = vinCheckDigit(upper);
  if (expected === null) return { ok: false, reason: 'bad_character' }; // unreachable after the tests above
  if (upper.charAt(CHECK_POSITION) !== expected) return { ok: false, reason: 'check_digit', expected };
  return { ok: true };
}
