import { normalisePartNumber, partNumberSegments } from '../part-number/normalise';
import { foldLookalikes, typosWithin } from './distance';

/** Where a number a part answers to comes from. Supplier and equivalents' numbers count as its own. */
export type NumberSource = 'own' | 'supplier' | 'equivalent';

/** One number a part answers to, as printed and normalised. */
export interface PartNumberEntry {
  number: string;
  key: string;
  source: NumberSource;
}

/** How well a part's numbers meet a typed query; `rank` orders hits inside the same kind (lower first). */
export interface NumberMatch {
  match: 'exact' | 'partial' | 'fuzzy';
  reason: string;
  rank: number;
}

/** Queries shorter than this only match as the start of a number (too short for contains or typos). */
export const MIN_SUBSTRING_QUERY = 3;

function exactReason(entry: PartNumberEntry): string {
  if (entry.source === 'own') return 'exact number';
  return `${entry.source === 'supplier' ? 'supplier' : 'equivalent'} number ${entry.number}`;
}

const typos = (n: number) => (n === 1 ? '1 typo' : `${n} typos`);

/**
 * Matches a typed query against the numbers of one part: exact key (own before supplier or
 * equivalent, then equal once O/0 and I/1 are folded); the number without its printed prefix ("3456" → "71-3456"); a number containing the
 * query (or starting with it, for queries under 3 characters); a number within the typo tolerance
 * (with O/0 and I/1 folded), also when the prefix was left out. Returns the best, or null.
 */
export function matchNumber(query: string, entries: readonly PartNumberEntry[]): NumberMatch | null {
  const key = normalisePartNumber(query);
  if (!key) return null;
  const folded = foldLookalikes(key);
  let best: NumberMatch | null = null;
  const offer = (candidate: NumberMatch) => {
    const order = { exact: 0, partial: 1, fuzzy: 2 } as const;
    if (!best || order[candidate.match] < order[best.match] || (candidate.match === best.match && candidate.rank < best.rank)) best = candidate;
  };
  for (const entry of entries) {
    if (entry.key === key) {
      offer({ match: 'exact', reason: exactReason(entry), rank: entry.source === 'own' ? 0 : 1 });
      continue;
    }
    const rest = partNumberSegments(entry.number);
    const entryFolded = foldLookalikes(entry.key);
    // Worn stampings: letter O and zero, letter I and one, are the same number.
    if (entryFolded === folded) {
      offer({ match: 'exact', reason: `${exactReason(entry)}, reading O as 0 and I as 1`, rank: 2 });
      continue;
    }
    const lengthGap = Math.abs(entry.key.length - key.length) / 100;
    if (key.length < MIN_SUBSTRING_QUERY) {
      if (entryFolded.startsWith(folded)) offer({ match: 'partial', reason: `number starts with ${key}`, rank: 1 + lengthGap });
      continue;
    }
    if (rest !== null && foldLookalikes(rest) === folded) {
      offer({ match: 'partial', reason: `number contains ${key}`, rank: 0 });
      continue;
    }
    if (entryFolded.includes(folded)) {
      offer({ match: 'partial', reason: `number contains ${key}`, rank: (entryFolded.startsWith(folded) ? 1 : 2) + lengthGap });
      continue;
    }
    const d = typosWithin(key, entry.key);
    if (d !== null) {
      offer({ match: 'fuzzy', reason: `close to ${entry.number} (${typos(d)})`, rank: d });
      continue;
    }
    if (rest !== null && rest.length >= MIN_SUBSTRING_QUERY) {
      const dr = typosWithin(key, rest);
      if (dr !== null) offer({ match: 'fuzzy', reason: `close to ${entry.number} (${typos(dr)}, no prefix)`, rank: dr + 0.5 });
    }
  }
  return best;
}
