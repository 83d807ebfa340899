import { osaDistance, typoTolerance } from './distance';

/** Words shorter than this must be typed exactly; from this length on, typos are forgiven. */
export const MIN_FORGIVING_WORD = 5;

/** The words of a text for matching: lower case, runs of letters and digits. */
export function wordsOf(text: string): string[] {
  return text.normalize('NFKC').toLowerCase().match(/[\p{L}\p{N}]+/gu) ?? [];
}

/** Result of matching typed words against a description. */
export interface DescriptionMatch {
  /** The description's words that the typed words matched, in the order typed. */
  words: string[];
  /** Total typos forgiven over all words. */
  typos: number;
}

/**
 * Matches typed words against a description, in any order. Every typed word must meet a word of
 * the description: equal; or, for the last typed word (still being typed), a prefix of one; or,
 * for words of 5 letters or more, within the typo tolerance (1 under 8 letters, 2 from 8 on).
 * Returns null when some typed word meets nothing, or nothing was typed.
 */
export function matchDescription(typed: string, description: string): DescriptionMatch | null {
  const wanted = wordsOf(typed);
  if (wanted.length === 0) return null;
  const have = wordsOf(description);
  const words: string[] = [];
  let typos = 0;
  for (const [i, word] of wanted.entries()) {
    const last = i === wanted.length - 1;
    let best: { word: string; typos: number } | null = null;
    for (const candidate of have) {
      if (candidate === word || (last && word.length >= 2 && candidate.startsWith(word))) {
        best = { word: candidate, typos: 0 };
        break;
      }
      if (word.length >= MIN_FORGIVING_WORD) {
        const tolerance = typoTolerance(word.length);
        const d = osaDistance(word, candidate, tolerance);
        if (d <= tolerance && (!best || d < best.typos)) best = { word: candidate, typos: d };
      }
    }
    if (!best) return null;
    words.push(best.word);
    typos += best.typos;
  }
  return { words, typos };
}
