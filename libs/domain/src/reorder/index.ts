export { demandStats, type DemandStats } from './demand-stats';
export { annualInventoryCost, eoq, type EoqInput } from './eoq';
export { inverseNormalCdf, normalCdf, zForServiceLevel } from './normal';
export { roundToPacks, type PackedQuantity, type PackRule } from './packs';
export {
  leadTimeDemand,
  reorderPoint,
  safetyStock,
  zOf,
  type LeadTimeDemand,
  type LeadTimeDemandModel,
  type ServiceTarget,
} from './reorder-point';
export { decideReorder, leadTimeDemandModel, substituteSupply, type ReorderDecision, type ReorderInput, type ReorderMethod, type SubstituteStock } from './suggest';
