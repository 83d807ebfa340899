import { type Edge, isUsable, type LineageIndex } from './lineage-index';
import { Ratio } from './ratio';
import { type CanFillResult, type FillOption } from './types';

/**
 * "What can fill one unit of demand for this part?"
 *
 * Filling is a directed relation between parts; an option is any set of available parts reachable
 * through it. The single-part steps are:
 * - forward along a part's only replaced_by link (any interchange; with_changes flags the option);
 * - backward along a replaced_by link only when it is 'both' and the older part was not split
 *   (a one-piece older part cannot stand in for just one piece of its split), at 1/quantity;
 * - along an equivalent link from → to (any direction flag), and to → from only when 'both'.
 * A part with several replaced_by links was split: its replacement is ONE option made of an
 * option for each piece (a cross product, capped).
 * A one_way link is never used backwards. nla parts are walked through but never offered.
 */

interface Step {
  edge: Edge & { ratio: Ratio };
  /** The link is walked from its `to` part back to its `from` part. */
  reverse: boolean;
}

interface InternalOption {
  parts: Map<number, Ratio>;
  via: string[];
  needsChanges: boolean;
}

/** How the search reached a part: a back-linked path, so a long chain does not copy its path per part. */
interface Reached {
  ratio: Ratio;
  changes: boolean;
  label: string | null;
  previous: Reached | null;
}

function pathOf(reached: Reached): string[] {
  const labels: string[] = [];
  for (let at: Reached | null = reached; at; at = at.previous) if (at.label !== null) labels.push(at.label);
  return labels.reverse();
}

/** Default cap on options per query, so that splits of splits cannot explode. */
export const DEFAULT_MAX_OPTIONS = 50;
/** Nesting of splits beyond this is cut off (and reported as truncated). */
const MAX_SPLIT_DEPTH = 16;

function times(ratio: Ratio): string {
  return ratio.equals(Ratio.ONE) ? '' : ` ×${ratio.toString()}`;
}

function stepLabel(index: LineageIndex, edge: Edge & { ratio: Ratio }, reverse: boolean): string {
  const from = index.part(edge.from).number;
  const text = `${edge.link.kind}:${edge.link.interchange} ${from} → ${edge.toNumber}${times(edge.ratio)}`;
  return reverse ? `${text}, used in reverse` : text;
}

/** The single-part fill steps out of `node` (see the module comment for the rules). */
function forEachStep(index: LineageIndex, node: number, visit: (step: Step) => void): void {
  const replacements = index.outgoing('replaced_by', node);
  const only = replacements.length === 1 ? replacements[0] : undefined;
  if (only && isUsable(only)) visit({ edge: only, reverse: false });
  for (const edge of index.incoming('replaced_by', node)) {
    if (!isUsable(edge) || edge.link.interchange !== 'both') continue;
    if (index.outgoing('replaced_by', edge.from).length !== 1) continue;
    visit({ edge, reverse: true });
  }
  // Equivalents are meant to be 'both' or 'one_way'; a stray with_changes is taken as one way, flagged.
  for (const edge of index.outgoing('equivalent', node)) if (isUsable(edge)) visit({ edge, reverse: false });
  for (const edge of index.incoming('equivalent', node)) {
    if (isUsable(edge) && edge.link.interchange === 'both') visit({ edge, reverse: true });
  }
}

const stepTarget = (step: Step): number => (step.reverse ? step.edge.from : step.edge.to);
const stepChanges = (step: Step): boolean => !step.reverse && step.edge.link.interchange === 'with_changes';

/** The pieces of a split, when it is one and every piece reaches a part with a usable quantity. */
function usableSplit(index: LineageIndex, node: number): Array<Edge & { ratio: Ratio }> | null {
  const pieces = index.outgoing('replaced_by', node);
  if (pieces.length < 2) return null;
  const usable: Array<Edge & { ratio: Ratio }> = [];
  for (const edge of pieces) {
    // A piece that cannot be resolved makes the whole set impossible.
    if (!isUsable(edge)) return null;
    usable.push(edge);
  }
  return usable;
}

function partsKey(parts: Map<number, Ratio>): string {
  return [...parts.keys()].sort((a, b) => a - b).join(',');
}

/** Breadth-first visits allowed per query (all nested splits together) before giving up as truncated. */
const MAX_VISITS = 1_000_000;

/**
 * One query's state. Options per part are memoised, except those computed while cut off at a part
 * further up the stack: that answer holds only for this stack, and reusing it elsewhere would
 * hide options.
 */
class FillSearch {
  truncated = false;
  private readonly memo = new Map<number, InternalOption[]>();
  /** Parts whose options are being computed, with their position on the stack. */
  private readonly inProgress = new Map<number, number>();
  /** Per stack frame: the lowest stack position it was cut off at. */
  private readonly frames: number[] = [];
  private visits = 0;

  constructor(
    private readonly index: LineageIndex,
    private readonly limit: number,
  ) {}

  optionsFor(start: number): InternalOption[] {
    const known = this.memo.get(start);
    if (known) return known;
    const at = this.inProgress.get(start);
    if (at !== undefined) {
      // A split piece that leads back to a split being expanded: that way round adds nothing.
      this.cutOffAt(at);
      return [];
    }
    const level = this.frames.length;
    if (level > MAX_SPLIT_DEPTH) {
      this.truncated = true;
      this.cutOffAt(-1); // an answer cut short by depth is not reused anywhere
      return [];
    }
    this.frames.push(level);
    this.inProgress.set(start, level);
    const options = this.search(start);
    this.inProgress.delete(start);
    const lowest = this.frames.pop()!;
    if (lowest >= level) this.memo.set(start, options);
    else this.frames[level - 1] = Math.min(this.frames[level - 1]!, lowest);
    return options;
  }

  private cutOffAt(level: number): void {
    const top = this.frames.length - 1;
    if (top >= 0) this.frames[top] = Math.min(this.frames[top]!, level);
  }

  /**
   * Breadth-first over single-part steps, in two rounds: everything reachable without changes
   * first, then what needs changes, so the simplest path to each part is the one kept.
   */
  private search(start: number): InternalOption[] {
    const options: InternalOption[] = [];
    const keys = new Set<string>();
    let full = false;
    const offer = (option: InternalOption): void => {
      const key = partsKey(option.parts);
      if (keys.has(key)) return;
      if (options.length >= this.limit) {
        this.truncated = true;
        full = true;
        return;
      }
      keys.add(key);
      options.push(option);
    };

    const reached = new Map<number, Reached>([[start, { ratio: Ratio.ONE, changes: false, label: null, previous: null }]]);
    const done = new Set<number>();
    const clean: number[] = [start];
    const changed: number[] = [];
    let cleanAt = 0;
    let changedAt = 0;

    while (!full) {
      let node: number;
      if (cleanAt < clean.length) node = clean[cleanAt++]!;
      else if (changedAt < changed.length) node = changed[changedAt++]!;
      else break;
      if (done.has(node)) continue;
      done.add(node);
      if (++this.visits > MAX_VISITS) {
        this.truncated = true;
        break;
      }
      const here = reached.get(node)!;

      if (this.index.part(node).status === 'available') {
        offer({ parts: new Map([[node, here.ratio]]), via: pathOf(here), needsChanges: here.changes });
      }
      this.offerSplit(node, here, offer);

      forEachStep(this.index, node, (step) => {
        const to = stepTarget(step);
        const changes = here.changes || stepChanges(step);
        const before = reached.get(to);
        // Only a first visit, or a clean path replacing a changes path not yet expanded.
        if (before && (!before.changes || changes || done.has(to))) return;
        const ratio = step.reverse ? step.edge.ratio.inverse() : step.edge.ratio;
        reached.set(to, { ratio: here.ratio.times(ratio), changes, label: stepLabel(this.index, step.edge, step.reverse), previous: here });
        (changes ? changed : clean).push(to);
      });
    }
    return options;
  }

  /** A split part is filled by one option per piece, all together. */
  private offerSplit(node: number, here: Reached, offer: (option: InternalOption) => void): void {
    const pieces = usableSplit(this.index, node);
    if (!pieces) return;
    const perPiece: Array<{ edge: Edge & { ratio: Ratio }; options: InternalOption[] }> = [];
    for (const edge of pieces) {
      const options = this.optionsFor(edge.to);
      if (options.length === 0) return;
      perPiece.push({ edge, options });
    }
    const labels = perPiece.map(({ edge }) => `${edge.ratio.equals(Ratio.ONE) ? '' : `${edge.ratio.toString()}×`}${edge.toNumber} (${edge.link.interchange})`);
    const splitLabel = `replaced_by:split ${this.index.part(node).number} → ${labels.join(' + ')}`;
    const splitChanges = perPiece.some(({ edge }) => edge.link.interchange === 'with_changes');

    const pathHere = pathOf(here);
    // Odometer over the pieces' options; stops as soon as the cap is reached.
    const choice = perPiece.map(() => 0);
    let made = 0;
    for (;;) {
      if (made >= this.limit) {
        this.truncated = true;
        return;
      }
      const parts = new Map<number, Ratio>();
      const via = [...pathHere, splitLabel];
      let needsChanges = here.changes || splitChanges;
      perPiece.forEach(({ edge, options }, i) => {
        const option = options[choice[i]!]!;
        const scale = here.ratio.times(edge.ratio);
        for (const [part, quantity] of option.parts) {
          const add = scale.times(quantity);
          const prior = parts.get(part);
          parts.set(part, prior ? prior.plus(add) : add);
        }
        via.push(...option.via);
        needsChanges ||= option.needsChanges;
      });
      offer({ parts, via, needsChanges });
      made += 1;

      let i = perPiece.length - 1;
      while (i >= 0 && choice[i]! + 1 >= perPiece[i]!.options.length) {
        choice[i] = 0;
        i -= 1;
      }
      if (i < 0) return;
      choice[i]! += 1;
    }
  }
}

/** All options (up to `maxOptions`) for filling one unit of demand for the part at `node`. */
export function canFill(index: LineageIndex, node: number, maxOptions = DEFAULT_MAX_OPTIONS): CanFillResult {
  const search = new FillSearch(index, Math.max(1, maxOptions));
  const internal = search.optionsFor(node);
  const options: FillOption[] = internal.map((option) => ({
    parts: [...option.parts].map(([part, quantity]) => index.partQuantity(part, quantity)),
    via: option.via,
    needsChanges: option.needsChanges,
  }));
  // Stable: within each group the breadth-first (shortest path) order stays.
  options.sort((a, b) => Number(a.needsChanges) - Number(b.needsChanges));
  return { options, truncated: search.truncated };
}

/**
 * For every part at once, whether anything available can fill it: the same answer as
 * `canFill(...).options.length > 0`, in one linear pass instead of a search per part (which would
 * walk long chains again and again). Fillability spreads backwards from the available parts: a
 * part is fillable when one of its single-part steps reaches a fillable part, or when it is a
 * split whose pieces are all fillable.
 */
export function fillableParts(index: LineageIndex): Uint8Array {
  const size = index.size;
  const fillable = new Uint8Array(size);
  // Who takes a step to each part, and which splits wait for each part as a piece.
  const stepsInto = new Array<number[] | undefined>(size).fill(undefined);
  const splitsWaiting = new Array<number[] | undefined>(size).fill(undefined);
  const missingPieces = new Int32Array(size);
  const add = (lists: Array<number[] | undefined>, at: number, node: number): void => {
    const list = lists[at];
    if (list) list.push(node);
    else lists[at] = [node];
  };
  const queue: number[] = [];
  for (let node = 0; node < size; node++) {
    forEachStep(index, node, (step) => add(stepsInto, stepTarget(step), node));
    const pieces = usableSplit(index, node);
    if (pieces) {
      const distinct = new Set(pieces.map((edge) => edge.to));
      missingPieces[node] = distinct.size;
      for (const piece of distinct) add(splitsWaiting, piece, node);
    }
    if (index.part(node).status === 'available') {
      fillable[node] = 1;
      queue.push(node);
    }
  }
  for (let at = 0; at < queue.length; at++) {
    const node = queue[at]!;
    for (const before of stepsInto[node] ?? []) {
      if (fillable[before]) continue;
      fillable[before] = 1;
      queue.push(before);
    }
    for (const split of splitsWaiting[node] ?? []) {
      missingPieces[split] = missingPieces[split]! - 1;
      if (missingPieces[split] === 0 && !fillable[split]) {
        fillable[split] = 1;
        queue.push(split);
      }
    }
  }
  return fillable;
}
