/**
 * Property tests over random invented catalogues. Strongly connected groups are checked against an
 * independent implementation: graphology-components' `stronglyConnectedComponents` (npm
 * `graphology` + `graphology-components`, a path-based algorithm, not Tarjan's).
 */
import fc from 'fast-check';
import { MultiDirectedGraph } from 'graphology';
import { stronglyConnectedComponents } from 'graphology-components';
import { describe, expect, it } from 'vitest';
import { buildLineageGraph } from './lineage-graph';
import { type Interchange, type LineageLink, type LineagePart, type LinkKind, type PartStatus } from './types';

interface Catalogue {
  parts: LineagePart[];
  links: LineageLink[];
}

const numberOf = (i: number): string => `P-${100 + i}`;
const idOf = (i: number): string => `id-${i}`;
const indexOfId = (id: string): number => Number(id.slice(3));

/** Quantities as exact fractions [numerator, denominator] and the number a catalogue would store. */
const QUANTITIES: ReadonlyArray<[bigint, bigint]> = [
  [1n, 1n],
  [2n, 1n],
  [3n, 1n],
  [1n, 2n],
  [1n, 4n],
  [3n, 2n],
];

interface CatalogueShape {
  maxParts?: number;
  kinds?: readonly LinkKind[];
  interchanges?: readonly Interchange[];
  /** Allow links to numbers that are not in the catalogue. */
  unknown?: boolean;
  /** Allow quantities the engine must reject (0, negative). */
  invalid?: boolean;
  /** replaced_by only from a lower to a higher index, so replaced_by alone is acyclic. */
  dag?: boolean;
  /** At most one replaced_by link per part. */
  noSplits?: boolean;
}

function catalogue(shape: CatalogueShape = {}): fc.Arbitrary<Catalogue> {
  const kinds = shape.kinds ?? ['replaced_by', 'kit_contains', 'equivalent'];
  const interchanges = shape.interchanges ?? ['both', 'one_way', 'with_changes'];
  return fc.integer({ min: 1, max: shape.maxParts ?? 9 }).chain((n) =>
    fc
      .record({
        statuses: fc.array(fc.constantFrom<PartStatus>('available', 'nla'), { minLength: n, maxLength: n }),
        links: fc.array(
          fc.record({
            kind: fc.constantFrom(...kinds),
            from: fc.integer({ min: 0, max: n - 1 }),
            to: fc.integer({ min: shape.unknown ? -1 : 0, max: n - 1 }),
            quantity: shape.invalid ? fc.oneof(fc.constantFrom(...QUANTITIES), fc.constant<[bigint, bigint]>([0n, 1n]), fc.constant<[bigint, bigint]>([-1n, 1n])) : fc.constantFrom(...QUANTITIES),
            interchange: fc.constantFrom(...interchanges),
          }),
          { maxLength: n * 2 },
        ),
      })
      .map(({ statuses, links }) => {
        const parts = statuses.map((status, i) => ({ id: idOf(i), number: numberOf(i), status }));
        const withSplits = new Set<number>();
        const result: LineageLink[] = [];
        links.forEach((raw, i) => {
          let { from, to } = raw;
          if (shape.dag && raw.kind === 'replaced_by' && to >= 0) {
            if (from === to) return;
            if (from > to) [from, to] = [to, from];
          }
          if (shape.noSplits && raw.kind === 'replaced_by') {
            if (withSplits.has(from)) return;
            withSplits.add(from);
          }
          const [num, den] = raw.quantity;
          result.push({
            id: `L${i}`,
            kind: raw.kind,
            fromId: idOf(from),
            toId: to < 0 ? null : idOf(to),
            ...(to < 0 && { toNumber: `X-${i}` }),
            quantity: Number(num) / Number(den),
            // Equivalents carry only both/one_way.
            interchange: raw.kind === 'equivalent' && raw.interchange === 'with_changes' ? 'one_way' : raw.interchange,
          });
        });
        return { parts, links: result };
      }),
  );
}

/** Independent exact fractions for the brute-force checks: [numerator, denominator], not reduced. */
type Frac = [bigint, bigint];
const fracOfNumber = (q: number): Frac => {
  const found = QUANTITIES.find(([n, d]) => Number(n) / Number(d) === q);
  if (!found) throw new Error(`quantity ${q} not from the generator`);
  return found;
};
const fracOfText = (text: string): Frac => {
  const [n = '0', d = '1'] = text.split('/');
  return [BigInt(n), BigInt(d)];
};
const sameFrac = (a: Frac, b: Frac): boolean => a[0] * b[1] === b[0] * a[1];

describe('lineage properties', () => {
  it('every query terminates and gives sane answers on any catalogue', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ unknown: true, invalid: true, maxParts: 10 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        const statusOf = new Map(parts.map((p) => [p.id, p.status]));
        const hasReplacement = new Set(links.filter((l) => l.kind === 'replaced_by').map((l) => l.fromId));
        for (const p of parts) {
          const { current } = graph.currentParts(p.id);
          // A current part has no onward replaced_by link (cycle members are never current).
          for (const c of current) expect(hasReplacement.has(c.partId)).toBe(false);
          for (const c of current) expect(c.quantity).toBeGreaterThan(0);

          const fill = graph.canFill(p.id);
          const keys = new Set<string>();
          for (const option of fill.options) {
            expect(option.parts.length).toBeGreaterThan(0);
            for (const q of option.parts) {
              expect(statusOf.get(q.partId)).toBe('available');
              expect(q.quantity).toBeGreaterThan(0);
            }
            const key = option.parts.map((q) => q.partId).sort().join(',');
            expect(keys.has(key)).toBe(false);
            keys.add(key);
            // A one_way link is never walked backwards.
            for (const step of option.via) expect(step.includes(':one_way') && step.endsWith('used in reverse')).toBe(false);
          }
          expect(fill.options.length).toBeLessThanOrEqual(50);

          const kit = graph.kitContents(p.id);
          expect(kit.items.length).toBeLessThanOrEqual(1000);

          const picture = graph.neighbourhood(p.id, { maxNodes: 5 });
          expect(picture.nodes.length).toBeLessThanOrEqual(5);
          expect(picture.nodes.filter((node) => node.isStart).map((node) => node.partId)).toEqual([p.id]);
          const nodeKeys = new Set(picture.nodes.map((node) => node.key));
          for (const edge of picture.edges) expect(nodeKeys.has(edge.from) && nodeKeys.has(edge.to)).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('quantities multiply along every path and add over paths (brute-force path enumeration on DAGs)', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ kinds: ['replaced_by'], dag: true, maxParts: 8 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        const out = new Map<number, Array<{ to: number; q: Frac }>>();
        for (const l of links) {
          const from = indexOfId(l.fromId);
          out.set(from, [...(out.get(from) ?? []), { to: indexOfId(l.toId!), q: fracOfNumber(l.quantity) }]);
        }
        // Every path from start to a part with no replacement, its quantities multiplied.
        const brute = (node: number, q: Frac, totals: Map<number, Frac>): void => {
          const next = out.get(node);
          if (!next) {
            const prior = totals.get(node) ?? [0n, 1n];
            totals.set(node, [prior[0] * q[1] + q[0] * prior[1], prior[1] * q[1]]);
            return;
          }
          for (const edge of next) brute(edge.to, [q[0] * edge.q[0], q[1] * edge.q[1]], totals);
        };
        for (let i = 0; i < parts.length; i++) {
          const expected = new Map<number, Frac>();
          brute(i, [1n, 1n], expected);
          const result = graph.currentParts(idOf(i));
          expect(result.unresolved).toEqual([]);
          expect(result.current.map((c) => indexOfId(c.partId)).sort()).toEqual([...expected.keys()].sort());
          for (const c of result.current) {
            expect(sameFrac(fracOfText(c.exactQuantity), expected.get(indexOfId(c.partId))!)).toBe(true);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  it('with only one_way links, options are the part itself or parts reached forwards', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ kinds: ['replaced_by', 'equivalent'], interchanges: ['one_way'], maxParts: 9 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        for (let i = 0; i < parts.length; i++) {
          const forward = new Set([i]);
          const queue = [i];
          for (let at = 0; at < queue.length; at++) {
            for (const l of links) {
              if (indexOfId(l.fromId) !== queue[at]) continue;
              const to = indexOfId(l.toId!);
              if (!forward.has(to)) {
                forward.add(to);
                queue.push(to);
              }
            }
          }
          for (const option of graph.canFill(idOf(i)).options) {
            for (const q of option.parts) expect(forward.has(indexOfId(q.partId))).toBe(true);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  it('without splits, the options are exactly the available parts reachable by the fill rules', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ kinds: ['replaced_by', 'equivalent'], noSplits: true, maxParts: 9 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        // The rules, written out independently: steps X → Y meaning "Y can fill X".
        const stepsFrom = (x: number, cleanOnly: boolean): number[] => {
          const next: number[] = [];
          for (const l of links) {
            const from = indexOfId(l.fromId);
            const to = indexOfId(l.toId!);
            if (from === x && !(cleanOnly && l.interchange === 'with_changes')) next.push(to);
            if (to === x && l.interchange === 'both') next.push(from);
          }
          return next;
        };
        const reach = (start: number, cleanOnly: boolean): Set<number> => {
          const seen = new Set([start]);
          const queue = [start];
          for (let at = 0; at < queue.length; at++) {
            for (const y of stepsFrom(queue[at]!, cleanOnly)) {
              if (!seen.has(y)) {
                seen.add(y);
                queue.push(y);
              }
            }
          }
          return seen;
        };
        for (let i = 0; i < parts.length; i++) {
          const all = reach(i, false);
          const clean = reach(i, true);
          const expected = [...all].filter((y) => parts[y]!.status === 'available').sort();
          const options = graph.canFill(idOf(i)).options;
          for (const option of options) expect(option.parts).toHaveLength(1);
          expect(options.map((o) => indexOfId(o.parts[0]!.partId)).sort()).toEqual(expected);
          for (const option of options) expect(option.needsChanges).toBe(!clean.has(indexOfId(option.parts[0]!.partId)));
        }
      }),
      { numRuns: 300 },
    );
  });

  it('every strongly connected group is reported exactly once (checked with graphology-components)', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ unknown: true, invalid: true, maxParts: 12 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        const reference = new MultiDirectedGraph({ allowSelfLoops: true });
        for (const p of parts) reference.addNode(p.id);
        const selfLinked = new Set<string>();
        for (const l of links) {
          if (l.kind === 'equivalent' || l.toId === null) continue;
          reference.addDirectedEdge(l.fromId, l.toId);
          if (l.fromId === l.toId) selfLinked.add(l.fromId);
        }
        const groupKey = (ids: string[]): string => [...ids].sort().join(' ');
        const expected = stronglyConnectedComponents(reference)
          .filter((c) => c.length > 1 || selfLinked.has(c[0]!))
          .map(groupKey)
          .sort();
        const reported = graph
          .problems()
          .filter((p) => p.kind === 'cycle')
          .map((p) => groupKey(p.partIds))
          .sort();
        expect(reported).toEqual(expected);

        // The per-part view agrees with the whole-catalogue report.
        const groupOf = new Map<string, string>();
        for (const key of expected) for (const id of key.split(' ')) groupOf.set(id, key);
        for (const p of parts) {
          const cycles = graph.problemsFor(p.id).filter((problem) => problem.kind === 'cycle');
          expect(cycles.map((c) => groupKey(c.partIds))).toEqual(groupOf.has(p.id) ? [groupOf.get(p.id)] : []);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('dead ends are exactly the nla parts nothing can fill whose replacements can all be filled', { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(catalogue({ unknown: true, maxParts: 9 }), ({ parts, links }) => {
        const graph = buildLineageGraph(parts, links);
        const stuck = new Set(parts.filter((p) => p.status === 'nla' && graph.canFill(p.id).options.length === 0).map((p) => p.id));
        const ends = [...stuck].filter((id) => links.every((l) => l.kind !== 'replaced_by' || l.fromId !== id || l.toId === null || !stuck.has(l.toId))).sort();
        const deadEnds = graph.problems().filter((p) => p.kind === 'dead_end');
        expect(deadEnds.map((p) => p.partIds[p.partIds.length - 1]).sort()).toEqual(ends);
        for (const problem of deadEnds) for (const id of problem.partIds) expect(stuck.has(id)).toBe(true);
        // What is reported for one part is what the whole-catalogue report says.
        const all = graph.problems();
        for (const p of parts) for (const problem of graph.problemsFor(p.id)) expect(all).toContainEqual(problem);
      }),
      { numRuns: 300 },
    );
  });
});
