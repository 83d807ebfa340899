import type { LineageProblemView, PartLink, PartOrigin, PartStatusValue } from '@tappet/contracts';

type LinkKind = PartLink['kind'];
type Interchange = PartLink['interchange'];

/** The origin of a part, in words. */
export const originWords: Record<PartOrigin, string> = {
  genuine: 'Genuine',
  reproduction: 'Reproduction',
  pattern: 'Pattern',
};

/** A part's status, in words. */
export const statusWordsOf: Record<PartStatusValue, string> = {
  available: 'Available',
  nla: 'No longer available',
};

/** The kind of a link read from its `from` end ("71-3456 is replaced by 71-3457"). */
export const kindWords: Record<LinkKind, string> = {
  replaced_by: 'is replaced by',
  kit_contains: 'kit contains',
  equivalent: 'is equivalent to',
};

/** The kind of a link read from its `to` end ("71-3457 replaces 71-3456"). */
export const kindWordsBackwards: Record<LinkKind, string> = {
  replaced_by: 'replaces',
  kit_contains: 'is in kit',
  equivalent: 'is equivalent to',
};

/** Short edge labels for the picture. */
export const kindShort: Record<LinkKind, string> = {
  replaced_by: 'replaced by',
  kit_contains: 'contains',
  equivalent: 'equivalent',
};

/** The kind as a choice in forms and filters. */
export const kindChoices: Record<LinkKind, string> = {
  replaced_by: 'Replaced by (supersession)',
  kit_contains: 'Kit contains (component)',
  equivalent: 'Equivalent (cross-reference)',
};

/**
 * How a link may be used, in the trade's words. For a replacement `one_way` means the new part
 * fits where the old one did, never the reverse; for an equivalent the `to` part stands in for
 * the `from` part only.
 */
export function interchangeWords(kind: LinkKind, interchange: Interchange): string {
  if (kind === 'kit_contains') return 'part of the kit';
  if (interchange === 'both') return 'fits both ways';
  if (interchange === 'with_changes') return 'fits with changes';
  return kind === 'equivalent' ? 'stands in one way only' : 'new fits old only';
}

/** Short form for edge labels: "both ways", "one way", "with changes". */
export function interchangeShort(kind: LinkKind, interchange: Interchange): string | null {
  if (kind === 'kit_contains') return null;
  return interchange === 'both' ? 'both ways' : interchange === 'one_way' ? 'one way' : 'with changes';
}

/** A quantity without trailing zeros ("×2", "×0.5"). */
export function quantityWords(quantity: number): string {
  return `×${Number.isInteger(quantity) ? quantity : Number(quantity.toFixed(4))}`;
}

/** A data problem of the lineage, in plain words with what to do about it. */
export function problemWords(problem: LineageProblemView): string {
  const numbers = problem.numbers.join(', ');
  switch (problem.kind) {
    case 'cycle':
      return `These numbers replace one another in a circle: ${problem.numbers.join(' → ')}. Remove or turn round one of their links so the chain ends.`;
    case 'dead_end':
      return `The line ends in a part no longer available, with nothing to replace it: ${numbers}. Link a replacement or an equivalent if one exists.`;
    case 'unknown_number':
      return `A link points to a number that is not in the catalogue: ${numbers}. Add that part, or correct the link.`;
    case 'invalid_quantity':
      return `A link has a quantity that cannot be used: ${numbers}. Correct the quantity on the link.`;
  }
}

/** A problem's kind as a short title. */
export const problemTitles: Record<LineageProblemView['kind'], string> = {
  cycle: 'Circular replacement',
  dead_end: 'Dead end',
  unknown_number: 'Number not in the catalogue',
  invalid_quantity: 'Unusable quantity',
};

/** "1 problem", "3 problems". */
export function countWords(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`;
}
