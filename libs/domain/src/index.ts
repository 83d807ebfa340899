// The one public entry of @tappet/domain.
export { normalisePartNumber, partNumberSegments } from './part-number/normalise';
export { compareFrameNumbers, frameInRange, type FrameComparison, type FrameInRange } from './fitment/frame-number';
export { buildLineageGraph, LineageGraph } from './lineage/lineage-graph';
export { LineageInputError, UnknownPartError } from './lineage/lineage-index';
export { Ratio } from './lineage/ratio';
export type {
  CanFillResult,
  CurrentPartsResult,
  FillOption,
  Interchange,
  KitContentsResult,
  KitItem,
  LineageLink,
  LineagePart,
  LineageProblem,
  LinkKind,
  Neighbourhood,
  NeighbourhoodEdge,
  NeighbourhoodNode,
  PartQuantity,
  PartStatus,
  UnresolvedQuantity,
  UnresolvedReason,
} from './lineage/types';
export * from './identifiers';
export * from './units';
export * from './money';
export * from './valuation';
export * from './reorder';
export * from './search';
export * from './checklists';
export * from './sales';
export { seededRandom } from './random/seeded-random';
