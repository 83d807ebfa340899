/**
 * Part numbers are printed, stamped and typed in many ways ("71-3456", "71 3456", "７１．３４５６").
 * Everything that compares or indexes part numbers goes through these helpers so that the same
 * number always meets itself.
 */

const NOT_ALNUM = /[^A-Z0-9]+/g;

/** Characters that separate the segments of a printed number: anything that is not A–Z or 0–9. */
const SEPARATOR_RUN = /[^A-Z0-9]+/;

/** NFKC folds full-width and compatibility forms (e.g. "７１－３４５６") onto plain ASCII before upper-casing. */
function fold(printed: string): string {
  return printed.normalize('NFKC').toUpperCase();
}

/**
 * Canonical key of a printed part number: NFKC-folded, upper case, and with everything that is not
 * an ASCII letter or digit removed. "71-3456", "71 3456" and "71.3456" all give "713456".
 * Idempotent; the result contains only [A-Z0-9] (possibly empty).
 */
export function normalisePartNumber(printed: string): string {
  return fold(printed).replace(NOT_ALNUM, '');
}

/**
 * The normalised remainder after the first separator of a printed number, for finding a number
 * typed without its prefix: "71-3456" gives "3456", "71-3456-A" gives "3456A".
 * Returns null when the number has no separator between two alphanumeric runs (e.g. "713456",
 * "-3456" or "71-").
 */
export function partNumberSegments(printed: string): string | null {
  // Leading/trailing separators are not "between" segments, so they never produce a match.
  const folded = fold(printed).replace(/^[^A-Z0-9]+/, '');
  const match = SEPARATOR_RUN.exec(folded);
  if (!match || match.index === 0) return null;
  const rest = folded.slice(match.index + match[0].length).replace(NOT_ALNUM, '');
  return rest === '' ? null : rest;
}
