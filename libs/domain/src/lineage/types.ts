/** Whether a part can still be obtained under its own number ('nla': no longer available). */
export type PartStatus = 'available' | 'nla';

/** The part fields the lineage engine needs. */
export interface LineagePart {
  id: string;
  number: string;
  status: PartStatus;
}

/**
 * How a replacement fits. 'both': either part fits where the other did. 'one_way': the newer part
 * fits where the older one did, never the reverse. 'with_changes': the newer part fits only after
 * modifying something. Equivalents use only 'both' and 'one_way'.
 */
export type Interchange = 'both' | 'one_way' | 'with_changes';

/**
 * 'replaced_by': `from` is superseded by `to` (several from one part = a split, needed together).
 * 'kit_contains': the kit `from` contains `quantity` × `to`.
 * 'equivalent': `to` (another maker's or supplier's number) can stand in for `from`; with
 * interchange 'both' also the reverse.
 */
export type LinkKind = 'replaced_by' | 'kit_contains' | 'equivalent';

/**
 * A link between two parts. `toId: null` with `toNumber` means the link points at a number that is
 * not in the catalogue. `quantity` is how many `to` take the place of (or sit in) one `from`.
 */
export interface LineageLink {
  id?: string;
  kind: LinkKind;
  fromId: string;
  toId: string | null;
  toNumber?: string;
  quantity: number;
  interchange: Interchange;
}

/** A part with a quantity. `quantity` is the nearest number; `exactQuantity` the exact ratio ("1/2"). */
export interface PartQuantity {
  partId: string;
  number: string;
  quantity: number;
  exactQuantity: string;
}

/** Why some quantity could not be followed to a part. */
export type UnresolvedReason = 'cycle' | 'unknown_number' | 'invalid_quantity';

/** Quantity that a walk could not resolve, with the number where it stopped. */
export interface UnresolvedQuantity {
  /** The catalogue part where the walk stopped, or null when the number is not in the catalogue. */
  partId: string | null;
  number: string;
  quantity: number;
  exactQuantity: string;
  reason: UnresolvedReason;
}

/**
 * A data problem found in the lineage. Reported, never looped on or guessed around.
 * - cycle: a strongly connected group over replaced_by and kit_contains links (or a self-link).
 * - dead_end: a chain ending in an nla part that nothing available can fill; the end comes last.
 * - unknown_number: a link to a number that is not in the catalogue (or from an id that is not).
 * - invalid_quantity: a link whose quantity is not a positive finite number; the engine ignores it.
 */
export interface LineageProblem {
  kind: 'cycle' | 'dead_end' | 'unknown_number' | 'invalid_quantity';
  numbers: string[];
  /** Catalogue parts involved (same order as `numbers` where both exist). */
  partIds: string[];
  /** Ids of the links involved, where the input links carried ids. */
  linkIds?: string[];
}

/** Everything that one unit of demand for a part is resolved to by following replaced_by links. */
export interface CurrentPartsResult {
  /** Parts needed together, with multiplied (and, for merges, summed) quantities. */
  current: PartQuantity[];
  /** Quantity that ran into a cycle, an unknown number or an invalid link. */
  unresolved: UnresolvedQuantity[];
  problems: LineageProblem[];
}

/** One way of filling one unit of demand: all of `parts` together. */
export interface FillOption {
  parts: PartQuantity[];
  /** Readable path of links used, e.g. "replaced_by:one_way 71-3456 → 71-3457". Empty for the part itself. */
  via: string[];
  /** Some link on the path is a with_changes replacement. */
  needsChanges: boolean;
}

export interface CanFillResult {
  options: FillOption[];
  /** More options (or deeper splits) existed than the cap allowed. */
  truncated: boolean;
}

/** A line of an expanded kit: a component at some depth with the multiplied quantity per kit. */
export interface KitItem extends PartQuantity {
  depth: number;
  /** The kit (or sub-kit) this line belongs to. */
  parentPartId: string;
  /** The component is a kit itself (its own lines follow it). */
  isKit: boolean;
}

export interface KitContentsResult {
  /** Pre-order: each sub-kit is followed by its own lines. Empty when the part is not a kit. */
  items: KitItem[];
  /** Components that are not kits themselves, quantities summed over every place they occur. */
  totals: PartQuantity[];
  unresolved: UnresolvedQuantity[];
  problems: LineageProblem[];
  truncated: boolean;
}

export interface NeighbourhoodNode {
  /** Unique within the result: the part id, or "unknown:" + the normalised number. */
  key: string;
  partId: string | null;
  number: string;
  status: PartStatus | null;
  isStart: boolean;
  /** The part has no onward replaced_by link: it is the end of its own chain. */
  isCurrent: boolean;
  /** The part is one of currentParts(start). */
  resolvesStart: boolean;
}

export interface NeighbourhoodEdge {
  key: string;
  kind: LinkKind;
  interchange: Interchange;
  quantity: number;
  exactQuantity: string;
  /** Node keys. */
  from: string;
  to: string;
}

export interface Neighbourhood {
  nodes: NeighbourhoodNode[];
  edges: NeighbourhoodEdge[];
  /** Related parts were left out to stay within maxNodes. */
  truncated: boolean;
}
