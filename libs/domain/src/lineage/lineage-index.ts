import { normalisePartNumber } from '../part-number/normalise';
import { Ratio } from './ratio';
import { type LineageLink, type LineagePart, type LinkKind, type PartQuantity, type UnresolvedQuantity, type UnresolvedReason } from './types';

/** Thrown when a query names a part id that is not in the graph. */
export class UnknownPartError extends Error {
  constructor(readonly partId: string) {
    super(`Part ${partId} is not in the lineage graph`);
    this.name = 'UnknownPartError';
  }
}

/**
 * Thrown when the input breaks the engine's contract (a duplicate part id, a link from an id that
 * is not a part). Those come from a broken caller, not from catalogue data, so they are not
 * reported as lineage problems.
 */
export class LineageInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'LineageInputError';
  }
}

/** A link resolved against the part index. */
export interface Edge {
  link: LineageLink;
  /** The link's id, or a stable stand-in from its input position. */
  key: string;
  from: number;
  /** Index of the target part, or -1 when the number is not in the catalogue. */
  to: number;
  /** Display number of the target. */
  toNumber: string;
  /** Exact quantity, or null when the input quantity is not a positive finite number. */
  ratio: Ratio | null;
}

/** The engine follows only edges that reach a part and carry a usable quantity. */
export function isUsable(edge: Edge): edge is Edge & { ratio: Ratio } {
  return edge.to >= 0 && edge.ratio !== null;
}

const NONE: readonly Edge[] = Object.freeze([]);

type Adjacency = Array<Edge[] | undefined>;

function push(adjacency: Adjacency, node: number, edge: Edge): void {
  const list = adjacency[node];
  if (list) list.push(edge);
  else adjacency[node] = [edge];
}

/**
 * Parts and links in integer-indexed adjacency lists, built once so that every query costs only
 * what it visits.
 */
export class LineageIndex {
  readonly parts: readonly LineagePart[];
  readonly edges: readonly Edge[];
  private readonly byId = new Map<string, number>();
  private readonly byNumber = new Map<string, number[]>();
  private readonly out: Record<LinkKind, Adjacency>;
  /** Incoming edges, only those that reach a catalogue part. */
  private readonly into: Record<LinkKind, Adjacency>;

  constructor(parts: readonly LineagePart[], links: readonly LineageLink[]) {
    this.parts = parts;
    // Filled to full length up front: arrays first written at scattered indexes fall back to slow
    // dictionary storage in V8.
    const adjacency = (): Adjacency => new Array<Edge[] | undefined>(parts.length).fill(undefined);
    this.out = { replaced_by: adjacency(), kit_contains: adjacency(), equivalent: adjacency() };
    this.into = { replaced_by: adjacency(), kit_contains: adjacency(), equivalent: adjacency() };
    parts.forEach((part, i) => {
      if (this.byId.has(part.id)) throw new LineageInputError(`Duplicate part id ${part.id}`);
      this.byId.set(part.id, i);
      const key = normalisePartNumber(part.number);
      const same = this.byNumber.get(key);
      if (same) same.push(i);
      else this.byNumber.set(key, [i]);
    });

    const edges: Edge[] = [];
    links.forEach((link, i) => {
      const from = this.byId.get(link.fromId);
      if (from === undefined) throw new LineageInputError(`Link ${link.id ?? i} starts at unknown part ${link.fromId}`);
      const to = link.toId === null ? -1 : (this.byId.get(link.toId) ?? -1);
      const ratio = Ratio.fromNumber(link.quantity);
      const edge: Edge = {
        link,
        key: link.id ?? `link-${i}`,
        from,
        to,
        toNumber: to >= 0 ? this.parts[to]!.number : (link.toNumber ?? link.toId ?? ''),
        ratio: ratio && ratio.isPositive() ? ratio : null,
      };
      edges.push(edge);
      push(this.out[link.kind], from, edge);
      if (to >= 0) push(this.into[link.kind], to, edge);
    });
    this.edges = edges;
  }

  get size(): number {
    return this.parts.length;
  }

  /** Index of a part id; throws UnknownPartError when absent. */
  indexOf(partId: string): number {
    const i = this.byId.get(partId);
    if (i === undefined) throw new UnknownPartError(partId);
    return i;
  }

  has(partId: string): boolean {
    return this.byId.has(partId);
  }

  /** Part indexes whose normalised number equals the normalised `printed`. */
  byNormalisedNumber(printed: string): readonly number[] {
    return this.byNumber.get(normalisePartNumber(printed)) ?? [];
  }

  part(node: number): LineagePart {
    return this.parts[node]!;
  }

  /** Outgoing edges of one kind, including those to unknown numbers or with invalid quantities. */
  outgoing(kind: LinkKind, node: number): readonly Edge[] {
    return this.out[kind][node] ?? NONE;
  }

  /** Incoming edges of one kind (always from catalogue parts). */
  incoming(kind: LinkKind, node: number): readonly Edge[] {
    return this.into[kind][node] ?? NONE;
  }

  /** Targets of usable replaced_by edges: the graph the resolution walk follows. */
  replacementTargets(node: number): number[] {
    const targets: number[] = [];
    for (const edge of this.outgoing('replaced_by', node)) if (isUsable(edge)) targets.push(edge.to);
    return targets;
  }

  /**
   * Targets of every replaced_by and kit_contains edge that reaches a part, whatever its quantity:
   * the structure in which cycles are data problems.
   */
  structuralTargets(node: number): number[] {
    const targets: number[] = [];
    for (const edge of this.outgoing('replaced_by', node)) if (edge.to >= 0) targets.push(edge.to);
    for (const edge of this.outgoing('kit_contains', node)) if (edge.to >= 0) targets.push(edge.to);
    return targets;
  }

  partQuantity(node: number, quantity: Ratio): PartQuantity {
    const part = this.part(node);
    return { partId: part.id, number: part.number, quantity: quantity.toNumber(), exactQuantity: quantity.toString() };
  }

  unresolved(node: number | null, number: string, quantity: Ratio, reason: UnresolvedReason): UnresolvedQuantity {
    return {
      partId: node === null ? null : this.part(node).id,
      number,
      quantity: quantity.toNumber(),
      exactQuantity: quantity.toString(),
      reason,
    };
  }
}
