import { canFill, DEFAULT_MAX_OPTIONS } from './fill';
import { LineageIndex } from './lineage-index';
import { DEFAULT_MAX_NODES, neighbourhood } from './neighbourhood';
import { ProblemFinder } from './problems';
import { currentParts, kitContents } from './resolve';
import {
  type CanFillResult,
  type CurrentPartsResult,
  type KitContentsResult,
  type LineageLink,
  type LineagePart,
  type LineageProblem,
  type Neighbourhood,
} from './types';

/**
 * The lineage of a catalogue: parts and their replaced_by, kit_contains and equivalent links,
 * indexed once. Queries cost what they visit, never a scan of the catalogue (except `problems()`,
 * which is the whole-catalogue report and is computed once).
 *
 * The graph is immutable: build a new one when the catalogue changes. Every method taking a part
 * id throws UnknownPartError for an id that is not in the graph.
 */
export class LineageGraph {
  private readonly index: LineageIndex;
  private readonly finder: ProblemFinder;

  /** Throws LineageInputError for a duplicate part id or a link from an id that is not a part. */
  constructor(parts: readonly LineagePart[], links: readonly LineageLink[]) {
    this.index = new LineageIndex(parts, links);
    this.finder = new ProblemFinder(this.index);
  }

  /** Number of parts. */
  get size(): number {
    return this.index.size;
  }

  /** Whether the part id is in the graph. */
  hasPart(partId: string): boolean {
    return this.index.has(partId);
  }

  /** Ids of the parts whose number matches `printed` once both are normalised. */
  partIdsByNumber(printed: string): string[] {
    return this.index.byNormalisedNumber(printed).map((node) => this.index.part(node).id);
  }

  /**
   * What one unit of the part resolves to today: replaced_by links followed to the end of every
   * branch, quantities multiplied along paths and summed where paths meet. A split gives several
   * parts needed together; a kit is a current part like any other (see kitContents). Quantity that
   * runs into a cycle, an unknown number or an invalid link is listed as unresolved, with its problem.
   */
  currentParts(partId: string): CurrentPartsResult {
    return currentParts(this.index, this.finder, this.index.indexOf(partId));
  }

  /** The lines of a kit, sub-kits expanded with multiplied quantities; empty when the part is not a kit. */
  kitContents(partId: string): KitContentsResult {
    return kitContents(this.index, this.finder, this.index.indexOf(partId));
  }

  /**
   * The ways one unit of demand for the part can be filled by available parts, respecting
   * interchange direction: the part itself, newer parts (with_changes ones flagged), older parts
   * only through 'both' replacements (at the inverse quantity), equivalents in their direction,
   * and the pieces of a split together as one option. At most `maxOptions` (default 50) options;
   * `truncated` says when there were more. Options needing no changes come first.
   */
  canFill(partId: string, options: { maxOptions?: number } = {}): CanFillResult {
    return canFill(this.index, this.index.indexOf(partId), options.maxOptions ?? DEFAULT_MAX_OPTIONS);
  }

  /** Every data problem in the catalogue, each cycle reported exactly once. Computed once, then cached. */
  problems(): LineageProblem[] {
    return this.finder.everything();
  }

  /** The problems that involve one part: its cycle, dead ends its chain runs into, its bad links. */
  problemsFor(partId: string): LineageProblem[] {
    return this.finder.forPart(this.index.indexOf(partId));
  }

  /**
   * The parts around one part (older, newer, equivalents, kit lines, kits it is in), at most
   * `maxNodes` (default 60) of them, with the links between them, for drawing a lineage picture.
   */
  neighbourhood(partId: string, options: { maxNodes?: number } = {}): Neighbourhood {
    const start = this.index.indexOf(partId);
    const resolves = new Set(this.currentParts(partId).current.map((entry) => this.index.indexOf(entry.partId)));
    return neighbourhood(this.index, start, options.maxNodes ?? DEFAULT_MAX_NODES, resolves);
  }
}

/** Builds a LineageGraph; the same as `new LineageGraph(parts, links)`. */
export function buildLineageGraph(parts: readonly LineagePart[], links: readonly LineageLink[]): LineageGraph {
  return new LineageGraph(parts, links);
}
