import { normalisePartNumber } from '../part-number/normalise';
import { type Edge, type LineageIndex } from './lineage-index';
import { type LinkKind, type Neighbourhood, type NeighbourhoodEdge, type NeighbourhoodNode } from './types';

const LINK_KINDS: readonly LinkKind[] = ['replaced_by', 'kit_contains', 'equivalent'];

/** Default size of a lineage picture: enough for a long chain with a kit, small enough to read. */
export const DEFAULT_MAX_NODES = 60;

function unknownKey(number: string): string {
  return `unknown:${normalisePartNumber(number)}`;
}

/**
 * The parts around one part, for drawing its lineage: first the chain forward to its current
 * parts (what a reader most wants to see), then breadth-first over every link in both directions —
 * older numbers, newer numbers, equivalents, kit lines and the kits it sits in — until `maxNodes`.
 * Numbers outside the catalogue appear as nodes without a part id.
 */
export function neighbourhood(index: LineageIndex, start: number, maxNodes: number, resolvesStart: ReadonlySet<number>): Neighbourhood {
  const limit = Math.max(1, Math.floor(maxNodes));
  const included = new Set<number>([start]);
  const unknown = new Map<string, string>(); // key -> printed number
  let truncated = false;

  const room = (): boolean => included.size + unknown.size < limit;

  // Round 1: the forward replaced_by chain, at most half of the picture.
  const forward = [start];
  for (let at = 0; at < forward.length && included.size < Math.ceil(limit / 2); at++) {
    for (const edge of index.outgoing('replaced_by', forward[at]!)) {
      if (edge.to < 0 || included.has(edge.to)) continue;
      if (included.size >= Math.ceil(limit / 2)) break;
      included.add(edge.to);
      forward.push(edge.to);
    }
  }

  // Round 2: breadth-first over everything.
  const queue = [start, ...forward.slice(1)];
  for (let at = 0; at < queue.length; at++) {
    const node = queue[at]!;
    const neighbours: Array<{ node: number } | { number: string }> = [];
    for (const kind of LINK_KINDS) {
      for (const edge of index.outgoing(kind, node)) neighbours.push(edge.to >= 0 ? { node: edge.to } : { number: edge.toNumber });
      for (const edge of index.incoming(kind, node)) neighbours.push({ node: edge.from });
    }
    for (const next of neighbours) {
      const isNew = 'node' in next ? !included.has(next.node) : !unknown.has(unknownKey(next.number));
      if (!isNew) continue;
      if (!room()) {
        truncated = true;
        break;
      }
      if ('node' in next) {
        included.add(next.node);
        queue.push(next.node);
      } else {
        unknown.set(unknownKey(next.number), next.number);
      }
    }
    if (truncated) break;
  }

  const nodes: NeighbourhoodNode[] = [...included].map((node) => {
    const part = index.part(node);
    return {
      key: part.id,
      partId: part.id,
      number: part.number,
      status: part.status,
      isStart: node === start,
      isCurrent: index.outgoing('replaced_by', node).length === 0,
      resolvesStart: resolvesStart.has(node),
    };
  });
  for (const [key, number] of unknown) {
    nodes.push({ key, partId: null, number, status: null, isStart: false, isCurrent: false, resolvesStart: false });
  }

  const edges: NeighbourhoodEdge[] = [];
  const addEdge = (edge: Edge, to: string): void => {
    edges.push({
      key: edge.key,
      kind: edge.link.kind,
      interchange: edge.link.interchange,
      quantity: edge.link.quantity,
      exactQuantity: edge.ratio?.toString() ?? String(edge.link.quantity),
      from: index.part(edge.from).id,
      to,
    });
  };
  for (const node of included) {
    for (const kind of LINK_KINDS) {
      for (const edge of index.outgoing(kind, node)) {
        if (edge.to >= 0) {
          if (included.has(edge.to)) addEdge(edge, index.part(edge.to).id);
        } else if (unknown.has(unknownKey(edge.toNumber))) {
          addEdge(edge, unknownKey(edge.toNumber));
        }
      }
    }
  }
  return { nodes, edges, truncated };
}
