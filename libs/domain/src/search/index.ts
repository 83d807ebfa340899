// Lookup that forgives (issue 5): pure matching and ranking; the database candidate search lives in the API.
export { foldedTyposWithin, foldedTyposWithinKeyOrTail, foldLookalikes, osaDistance, partNumberDistance, typoTolerance, typosWithin } from './distance';
export { matchDescription, wordsOf, MIN_FORGIVING_WORD, type DescriptionMatch } from './description';
export { matchNumber, MIN_SUBSTRING_QUERY, type NumberMatch, type NumberSource, type PartNumberEntry } from './number-match';
export { compareHits, lineageReason, matchOrder, mergeHits, type MatchKind, type SearchHit } from './rank';
export { trigramsOf } from './trigrams';
