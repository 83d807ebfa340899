import { isUsable, type LineageIndex } from './lineage-index';
import { type ProblemFinder } from './problems';
import { Ratio } from './ratio';
import { stronglyConnected } from './tarjan';
import { type CurrentPartsResult, type KitContentsResult, type KitItem, type LineageProblem, type UnresolvedQuantity } from './types';

/** Most lines an expanded kit lists before it is cut off (kits of kits can repeat sub-kits). */
const MAX_KIT_ITEMS = 1000;

/** Collects problems once each, in the order they are met. */
class ProblemList {
  readonly items: LineageProblem[] = [];
  private readonly seen = new Set<LineageProblem>();
  add(...problems: LineageProblem[]): void {
    for (const problem of problems) {
      if (this.seen.has(problem)) continue;
      this.seen.add(problem);
      this.items.push(problem);
    }
  }
}

/**
 * Follows replaced_by links from one part to the end of every branch. Quantities multiply along a
 * path and add up where paths meet again. The walk is a flow over the reachable graph in
 * topological order, so a catalogue full of diamonds costs linear time, not one pass per path.
 */
export function currentParts(index: LineageIndex, finder: ProblemFinder, start: number): CurrentPartsResult {
  // Tarjan returns components sinks-first; walking them backwards is a topological order.
  const components = stronglyConnected([start], (n) => index.replacementTargets(n));
  const flow = new Map<number, Ratio>([[start, Ratio.ONE]]);
  const current = new Map<number, Ratio>();
  const unresolved: UnresolvedQuantity[] = [];
  const problems = new ProblemList();

  for (let c = components.length - 1; c >= 0; c--) {
    const component = components[c]!;
    const cyclic = component.length > 1 || index.replacementTargets(component[0]!).includes(component[0]!);
    for (const node of component) {
      const quantity = flow.get(node);
      if (!quantity) continue; // reachable only through a cycle, which the walk does not enter
      const part = index.part(node);
      if (cyclic) {
        // The walk stops at a cycle: its quantity has no answer to go to.
        unresolved.push(index.unresolved(node, part.number, quantity, 'cycle'));
        const cycle = finder.cycleContaining(node);
        if (cycle) problems.add(cycle);
        continue;
      }
      const onward = index.outgoing('replaced_by', node);
      if (onward.length === 0) {
        current.set(node, quantity);
        if (finder.isStuck(node)) problems.add(finder.deadEnd(node));
        continue;
      }
      for (const edge of onward) {
        if (isUsable(edge)) {
          const add = quantity.times(edge.ratio);
          const prior = flow.get(edge.to);
          flow.set(edge.to, prior ? prior.plus(add) : add);
        } else {
          const reason = edge.to < 0 ? 'unknown_number' : 'invalid_quantity';
          const target = edge.to < 0 ? null : edge.to;
          const lost = edge.ratio ? quantity.times(edge.ratio) : quantity;
          unresolved.push(index.unresolved(target, edge.toNumber, lost, reason));
          problems.add(...finder.problemsOfLink(edge));
        }
      }
    }
  }

  return {
    current: [...current].map(([node, quantity]) => index.partQuantity(node, quantity)),
    unresolved,
    problems: problems.items,
  };
}

/** Path of kits from the top down to a line, to keep the expansion from entering a kit it is inside. */
interface KitPath {
  node: number;
  parent: KitPath | null;
}

function onPath(path: KitPath | null, node: number): boolean {
  for (let at = path; at; at = at.parent) if (at.node === node) return true;
  return false;
}

/**
 * Expands a kit into its lines, depth first, multiplying quantities through sub-kits. A kit that
 * (directly or through sub-kits) contains itself is reported as a cycle and not expanded again.
 */
export function kitContents(index: LineageIndex, finder: ProblemFinder, kit: number): KitContentsResult {
  const items: KitItem[] = [];
  const totals = new Map<number, Ratio>();
  const unresolved: UnresolvedQuantity[] = [];
  const problems = new ProblemList();
  let truncated = false;

  interface Pending {
    node: number;
    quantity: Ratio;
    path: KitPath;
    depth: number;
  }
  const stack: Pending[] = [{ node: kit, quantity: Ratio.ONE, path: { node: kit, parent: null }, depth: 0 }];

  while (stack.length > 0) {
    const { node, quantity, path, depth } = stack.pop()!;
    const lines = index.outgoing('kit_contains', node);
    if (depth > 0) {
      if (items.length >= MAX_KIT_ITEMS) {
        truncated = true;
        break;
      }
      const parentPartId = index.part(path.parent!.node).id;
      const isKit = lines.length > 0;
      items.push({ ...index.partQuantity(node, quantity), depth, parentPartId, isKit });
      if (onPath(path.parent, node)) {
        // A kit inside itself: the line is listed so it can be seen, but never expanded again.
        const cycle = finder.cycleContaining(node);
        if (cycle) problems.add(cycle);
        continue;
      }
      if (!isKit) {
        const prior = totals.get(node);
        totals.set(node, prior ? prior.plus(quantity) : quantity);
      }
    }
    // Pushed in reverse so that lines come out in their input order.
    for (let i = lines.length - 1; i >= 0; i--) {
      const edge = lines[i]!;
      if (isUsable(edge)) {
        stack.push({ node: edge.to, quantity: quantity.times(edge.ratio), path: { node: edge.to, parent: path }, depth: depth + 1 });
        continue;
      }
      const target = edge.to < 0 ? null : edge.to;
      const lost = edge.ratio ? quantity.times(edge.ratio) : quantity;
      unresolved.push(index.unresolved(target, edge.toNumber, lost, edge.to < 0 ? 'unknown_number' : 'invalid_quantity'));
      problems.add(...finder.problemsOfLink(edge));
    }
  }

  return {
    items,
    totals: [...totals].map(([node, quantity]) => index.partQuantity(node, quantity)),
    unresolved,
    problems: problems.items,
    truncated,
  };
}
