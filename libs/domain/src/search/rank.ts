/** Why a part is in the lookup answer, best first: exact number, lineage relative, part of a number, typo. */
export type MatchKind = 'exact' | 'lineage' | 'partial' | 'fuzzy';

export const matchOrder: Readonly<Record<MatchKind, number>> = { exact: 0, lineage: 1, partial: 2, fuzzy: 3 };

/** A reason one part matched. `rank` orders hits of the same kind (lower first); `tieBreak` after it (e.g. a fuse.js score, lower first). */
export interface SearchHit {
  partId: string;
  match: MatchKind;
  reason: string;
  rank: number;
  tieBreak?: number;
}

/** Compares two hits: kind, then rank, then tie-break. */
export function compareHits(a: SearchHit, b: SearchHit): number {
  return matchOrder[a.match] - matchOrder[b.match] || a.rank - b.rank || (a.tieBreak ?? 1) - (b.tieBreak ?? 1);
}

/**
 * Merges hits from every matcher into the answer: each part once, with its best hit; ordered
 * exact, lineage, partial, fuzzy (then by rank and tie-break; equal hits keep their input order);
 * at most `limit`.
 */
export function mergeHits(hits: Iterable<SearchHit>, limit: number): SearchHit[] {
  const best = new Map<string, SearchHit>();
  for (const hit of hits) {
    const held = best.get(hit.partId);
    if (!held || compareHits(hit, held) < 0) best.set(hit.partId, hit);
  }
  return [...best.values()].sort(compareHits).slice(0, Math.max(0, limit));
}

/**
 * Plain words for a lineage relative reached from the part a number named, from the fill path the
 * lineage engine reports (`via`, e.g. "equivalent:one_way 71-3456 → RP-3456").
 */
export function lineageReason(fromNumber: string, via: readonly string[], needsChanges: boolean): string {
  const first = via[0] ?? '';
  const interchange = /^[a-z_]+:([a-z_]+)/.exec(first)?.[1];
  const reverse = first.endsWith(', used in reverse');
  let text: string;
  if (first.startsWith('equivalent:')) text = `can stand in for ${fromNumber} (${interchange === 'one_way' ? 'one way' : 'both ways'})`;
  else if (first.startsWith('replaced_by:split')) text = `replaces ${fromNumber} together with other parts`;
  else if (first.startsWith('replaced_by:') && reverse) text = `older part that fits where ${fromNumber} does`;
  else if (first.startsWith('replaced_by:')) text = `replaces ${fromNumber}`;
  else text = `related to ${fromNumber}`;
  if (via.length > 1) text += ` (through ${via.length} links)`;
  return needsChanges ? `${text}, needs changes` : text;
}
