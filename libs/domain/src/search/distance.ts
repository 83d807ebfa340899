/**
 * Edit distance for part numbers typed at the bench. Optimal string alignment (the restricted
 * Damerau–Levenshtein distance): insertions, deletions, substitutions and transpositions of two
 * neighbouring characters each cost 1, and no substring is edited twice. That is the distance
 * people mean by "one typo", and it can be cut off early once it exceeds a bound.
 */

/** Letters that are read for digits on stamped and worn parts: O for zero, I for one. */
const LOOKALIKES: Readonly<Record<string, string>> = { O: '0', I: '1' };

/**
 * Folds the letters O and I onto the digits 0 and 1 in a normalised key, so "7I-3O56" and
 * "71-3056" compare equal. Apply to keys from `normalisePartNumber` (upper case).
 */
export function foldLookalikes(key: string): string {
  return key.replace(/[OI]/g, (c) => LOOKALIKES[c] ?? c);
}

/**
 * Optimal string alignment distance between `a` and `b` (no folding). With `max`, stops as soon
 * as the answer must exceed it and returns `max + 1`; without it the exact distance.
 */
export function osaDistance(a: string, b: string, max = Number.POSITIVE_INFINITY): number {
  if (a === b) return 0;
  const n = a.length;
  const m = b.length;
  if (Math.abs(n - m) > max) return max + 1;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rolling rows (two back for transpositions, one back, the current one), kept between
  // calls: the lookup runs this on hundreds of candidates per keystroke.
  if (rows[0].length <= m) rows = [new Int32Array(2 * m + 2), new Int32Array(2 * m + 2), new Int32Array(2 * m + 2)];
  let [before, previous, current] = rows;
  for (let j = 0; j <= m; j++) previous[j] = j;
  for (let i = 1; i <= n; i++) {
    current[0] = i;
    let rowMin = i;
    const ai = a.charCodeAt(i - 1);
    const aBefore = i > 1 ? a.charCodeAt(i - 2) : -1;
    for (let j = 1; j <= m; j++) {
      const bj = b.charCodeAt(j - 1);
      const cost = ai === bj ? 0 : 1;
      let value = previous[j]! + 1;
      const left = current[j - 1]! + 1;
      if (left < value) value = left;
      const diagonal = previous[j - 1]! + cost;
      if (diagonal < value) value = diagonal;
      if (j > 1 && aBefore === bj && ai === b.charCodeAt(j - 2) && before[j - 2]! + 1 < value) value = before[j - 2]! + 1;
      current[j] = value;
      if (value < rowMin) rowMin = value;
    }
    if (rowMin > max) return max + 1;
    [before, previous, current] = [previous, current, before];
  }
  const result = previous[m]!;
  return result > max ? max + 1 : result;
}

let rows: [Int32Array, Int32Array, Int32Array] = [new Int32Array(64), new Int32Array(64), new Int32Array(64)];

/**
 * The typo distance between two normalised part-number keys: optimal string alignment after
 * folding O→0 and I→1 on both. Symmetric; 0 exactly when the folded keys are equal; never more
 * than the longer key's length.
 */
export function partNumberDistance(a: string, b: string, max?: number): number {
  return osaDistance(foldLookalikes(a), foldLookalikes(b), max);
}

/** How many typos a key of this length forgives: 1 under 8 characters, 2 from 8 on. */
export function typoTolerance(length: number): number {
  return length < 8 ? 1 : 2;
}

/**
 * Whether `typed` is within the typo tolerance of the catalogue key `key` (tolerance taken from the
 * catalogue key's length). Returns the distance, or null when it is too far.
 */
export function typosWithin(typed: string, key: string): number | null {
  return foldedTyposWithin(foldLookalikes(typed), foldLookalikes(key));
}

/** `typosWithin` for keys already folded with `foldLookalikes` (the lookup folds the typed key once). */
export function foldedTyposWithin(typed: string, key: string): number | null {
  const tolerance = typoTolerance(key.length);
  if (Math.abs(typed.length - key.length) > tolerance) return null;
  const d = osaDistance(typed, key, tolerance);
  return d <= tolerance ? d : null;
}

/**
 * Whether the folded typed key is within the typo tolerance of the folded key `text[start, end)`
 * or of one of its tails of `minTail` characters or more (the printed prefix left out): the same answer
 * as `foldedTyposWithin(typed, tail)` over the whole key and every such tail, from one table
 * instead of one per tail. The table runs over both strings reversed, so row i holds the distance
 * from the typed key to the key's last i characters (optimal string alignment reads the same
 * either way round), and it stops once a row's minimum passes the largest tolerance (rows never
 * get better). No allocation: the lookup runs this on hundreds of candidates per keystroke.
 */
export function foldedTyposWithinKeyOrTail(typed: string, text: string, start: number, end: number, minTail: number): boolean {
  const m = typed.length;
  const n = end - start;
  if (n <= 0) return false;
  const largest = typoTolerance(Number.MAX_SAFE_INTEGER);
  if (missingFrom(typed, text, start, end) > largest) return false;
  if (tailRows[0].length <= m) tailRows = [new Int32Array(2 * m + 2), new Int32Array(2 * m + 2), new Int32Array(2 * m + 2)];
  let [before, previous, current] = tailRows;
  for (let j = 0; j <= m; j++) previous[j] = j;
  for (let i = 1; i <= n; i++) {
    current[0] = i;
    let rowMin = i;
    const ki = text.charCodeAt(end - i);
    const kBefore = i > 1 ? text.charCodeAt(end - i + 1) : -1;
    for (let j = 1; j <= m; j++) {
      const tj = typed.charCodeAt(m - j);
      let value = previous[j]! + 1;
      const left = current[j - 1]! + 1;
      if (left < value) value = left;
      const diagonal = previous[j - 1]! + (ki === tj ? 0 : 1);
      if (diagonal < value) value = diagonal;
      if (j > 1 && kBefore === tj && ki === typed.charCodeAt(m - j + 1) && before[j - 2]! + 1 < value) value = before[j - 2]! + 1;
      current[j] = value;
      if (value < rowMin) rowMin = value;
    }
    if ((i === n || i >= minTail) && current[m]! <= typoTolerance(i)) return true;
    if (rowMin > largest) return false;
    [before, previous, current] = [previous, current, before];
  }
  return false;
}

/**
 * How many of the typed key's characters (counted with repeats) `text[start, end)` lacks: a lower
 * bound on the distance to it and to every tail of it, since each edit supplies at most one
 * missing character. Counting is linear, so most candidates are turned away before any table.
 * 0 (no bound) when the typed key holds a character outside ASCII.
 */
function missingFrom(typed: string, text: string, start: number, end: number): number {
  for (let j = 0; j < typed.length; j++) if (typed.charCodeAt(j) >= 128) return 0;
  for (let j = 0; j < typed.length; j++) wanted[typed.charCodeAt(j)]!++;
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c < 128 && wanted[c]! > 0) wanted[c]!--;
  }
  let missing = 0;
  for (let j = 0; j < typed.length; j++) {
    const c = typed.charCodeAt(j);
    missing += wanted[c]!;
    wanted[c] = 0;
  }
  return missing;
}

const wanted = new Int32Array(128);

let tailRows: [Int32Array, Int32Array, Int32Array] = [new Int32Array(64), new Int32Array(64), new Int32Array(64)];
