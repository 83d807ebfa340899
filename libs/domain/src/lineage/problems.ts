import { fillableParts } from './fill';
import { type Edge, isUsable, type LineageIndex } from './lineage-index';
import { stronglyConnected } from './tarjan';
import { type LineageProblem, type LinkKind } from './types';

const LINK_KINDS: readonly LinkKind[] = ['replaced_by', 'kit_contains', 'equivalent'];
/** A dead end lists at most this many of the parts whose chain ends there. */
const MAX_DEAD_END_CHAIN = 500;

/**
 * Finds data problems and caches them, so that the same problem found from different starting
 * points is the same object with the same content.
 */
export class ProblemFinder {
  private readonly cycleAt = new Map<number, LineageProblem | null>();
  private fillable: Uint8Array | undefined;
  private readonly deadEnds = new Map<number, LineageProblem>();
  private readonly linkProblems = new Map<Edge, LineageProblem[]>();
  private all: LineageProblem[] | undefined;

  constructor(private readonly index: LineageIndex) {}

  /** Every problem in the graph: each cycle exactly once, then dead ends, then link problems. */
  everything(): LineageProblem[] {
    if (this.all) return this.all;
    const index = this.index;
    const nodes = Array.from({ length: index.size }, (_, i) => i);
    const problems: LineageProblem[] = [];
    for (const component of stronglyConnected(nodes, (n) => index.structuralTargets(n))) {
      const problem = this.cycleFromComponent(component);
      if (problem) problems.push(problem);
    }
    for (const node of nodes) {
      if (this.isStuck(node) && this.isDeadEnd(node)) problems.push(this.deadEnd(node));
    }
    for (const edge of index.edges) problems.push(...this.problemsOfLink(edge));
    this.all = problems;
    return problems;
  }

  /** Problems that involve one part: its cycle, the dead ends its chain runs into, its bad links. */
  forPart(node: number): LineageProblem[] {
    const problems: LineageProblem[] = [];
    const cycle = this.cycleContaining(node);
    if (cycle) problems.push(cycle);
    if (this.isStuck(node)) problems.push(...this.deadEndsReachedFrom(node));
    for (const kind of LINK_KINDS) {
      for (const edge of this.index.outgoing(kind, node)) problems.push(...this.problemsOfLink(edge));
    }
    return problems;
  }

  /** The cycle (strongly connected group over replaced_by and kit_contains) that `node` is in, if any. */
  cycleContaining(node: number): LineageProblem | null {
    const known = this.cycleAt.get(node);
    if (known !== undefined) return known;
    // From `node`, Tarjan completes node's own component last.
    const components = stronglyConnected([node], (n) => this.index.structuralTargets(n));
    const own = components[components.length - 1]!;
    return this.cycleFromComponent(own);
  }

  /** unknown_number and invalid_quantity problems of one link (usually none). */
  problemsOfLink(edge: Edge): LineageProblem[] {
    const known = this.linkProblems.get(edge);
    if (known) return known;
    const problems: LineageProblem[] = [];
    const from = this.index.part(edge.from);
    const linkIds = edge.link.id === undefined ? undefined : [edge.link.id];
    if (edge.to < 0) {
      problems.push({ kind: 'unknown_number', numbers: [edge.toNumber], partIds: [from.id], ...(linkIds && { linkIds }) });
    }
    if (edge.ratio === null) {
      problems.push({ kind: 'invalid_quantity', numbers: [from.number, edge.toNumber], partIds: [from.id], ...(linkIds && { linkIds }) });
    }
    this.linkProblems.set(edge, problems);
    return problems;
  }

  /**
   * An nla part that nothing available can fill. The first call works out every part in one
   * linear pass; after that each answer is a lookup.
   */
  isStuck(node: number): boolean {
    this.fillable ??= fillableParts(this.index);
    return this.fillable[node] === 0;
  }

  /** The dead-end problem whose chain ends at the stuck part `end`. */
  deadEnd(end: number): LineageProblem {
    const known = this.deadEnds.get(end);
    if (known) return known;
    // Walk back over stuck parts only: those are the ones whose chain ends here.
    const chain: number[] = [end];
    const seen = new Set(chain);
    for (let at = 0; at < chain.length && chain.length < MAX_DEAD_END_CHAIN; at++) {
      for (const edge of this.index.incoming('replaced_by', chain[at]!)) {
        if (!isUsable(edge) || seen.has(edge.from) || !this.isStuck(edge.from)) continue;
        seen.add(edge.from);
        chain.push(edge.from);
        if (chain.length >= MAX_DEAD_END_CHAIN) break;
      }
    }
    chain.reverse(); // oldest first, the end last
    const problem: LineageProblem = {
      kind: 'dead_end',
      numbers: chain.map((n) => this.index.part(n).number),
      partIds: chain.map((n) => this.index.part(n).id),
    };
    this.deadEnds.set(end, problem);
    return problem;
  }

  /** A stuck part is where its chain ends when none of its replacements is stuck as well. */
  private isDeadEnd(node: number): boolean {
    return this.index.replacementTargets(node).every((next) => !this.isStuck(next));
  }

  private deadEndsReachedFrom(node: number): LineageProblem[] {
    const problems: LineageProblem[] = [];
    const seen = new Set([node]);
    const queue = [node];
    for (let at = 0; at < queue.length; at++) {
      const here = queue[at]!;
      if (this.isDeadEnd(here)) problems.push(this.deadEnd(here));
      for (const next of this.index.replacementTargets(here)) {
        if (seen.has(next) || !this.isStuck(next)) continue;
        seen.add(next);
        queue.push(next);
      }
    }
    return problems;
  }

  private cycleFromComponent(component: number[]): LineageProblem | null {
    const index = this.index;
    const first = component[0]!;
    const known = this.cycleAt.get(first);
    if (known !== undefined) return known;
    const isCycle = component.length > 1 || index.structuralTargets(first).includes(first);
    let problem: LineageProblem | null = null;
    if (isCycle) {
      // Sorted so that the same group always reads the same, wherever it was found from.
      const members = [...component].sort((a, b) => {
        const x = index.part(a);
        const y = index.part(b);
        return x.number < y.number ? -1 : x.number > y.number ? 1 : x.id < y.id ? -1 : x.id > y.id ? 1 : 0;
      });
      problem = { kind: 'cycle', numbers: members.map((n) => index.part(n).number), partIds: members.map((n) => index.part(n).id) };
    }
    for (const member of component) this.cycleAt.set(member, problem);
    return problem;
  }
}
