import { normalisePartNumber } from '../part-number/normalise';

/** Result of comparing two frame numbers: ordered, or 'unknown' when they belong to different series. */
export type FrameComparison = -1 | 0 | 1 | 'unknown';

/** Whether a frame number lies within a fitment range. 'unknown' is never turned into a guess. */
export type FrameInRange = 'yes' | 'no' | 'unknown';

interface SplitFrame {
  prefix: string;
  tail: bigint;
}

/**
 * Splits a frame number into its series prefix and numeric tail. The split is made on the printed
 * form (before separators are dropped) so that "AB12-345" keeps "AB12" as its prefix instead of
 * reading the digits of the prefix as part of the serial.
 */
function splitFrame(frame: string): SplitFrame | null {
  // Separators after the last digit ("DU12345 ") carry no meaning.
  const folded = frame.normalize('NFKC').toUpperCase().replace(/[^A-Z0-9]+$/, '');
  const match = /^(.*?)(\d+)$/.exec(folded);
  if (!match) return null;
  const [, rawPrefix = '', digits = ''] = match;
  // BigInt: serials can be longer than Number can hold exactly.
  return { prefix: normalisePartNumber(rawPrefix), tail: BigInt(digits) };
}

/**
 * Compares two frame numbers of the same series. Each is split into a prefix (everything before
 * the trailing run of digits, normalised) and the numeric value of that run. The tails are compared
 * only when the prefixes are equal; otherwise, or when either has no trailing digits, the answer is
 * 'unknown'.
 *
 * @example compareFrameNumbers('DU-1200', 'du 987') // 1
 */
export function compareFrameNumbers(a: string, b: string): FrameComparison {
  const left = splitFrame(a);
  const right = splitFrame(b);
  if (!left || !right || left.prefix !== right.prefix) return 'unknown';
  if (left.tail === right.tail) return 0;
  return left.tail < right.tail ? -1 : 1;
}

function isAbsent(bound: string | null | undefined): bound is null | undefined {
  return bound == null || normalisePartNumber(bound) === '';
}

/**
 * Whether `frame` lies within the inclusive range [from, to]. A missing (or blank) bound is open.
 * Returns 'no' when a comparable bound excludes the frame, 'unknown' when some bound cannot be
 * compared with it (different series, no serial digits), and 'yes' otherwise.
 */
export function frameInRange(frame: string, from?: string | null, to?: string | null): FrameInRange {
  let unknown = false;
  if (!isAbsent(from)) {
    const c = compareFrameNumbers(frame, from);
    if (c === 'unknown') unknown = true;
    else if (c < 0) return 'no';
  }
  if (!isAbsent(to)) {
    const c = compareFrameNumbers(frame, to);
    if (c === 'unknown') unknown = true;
    else if (c > 0) return 'no';
  }
  return unknown ? 'unknown' : 'yes';
}
