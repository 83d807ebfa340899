export { divideRoundHalfAway } from './rounding';
export {
  defaultPricingRules,
  priceRoundings,
  roundSellPrice,
  sellPrice,
  type PriceBasis,
  type PriceRounding,
  type PricingInput,
  type PricingRules,
  type SellPrice,
} from './pricing';
export {
  documentTotals,
  lineNetMinor,
  taxRoundings,
  type DocumentLineInput,
  type DocumentLineTotals,
  type DocumentTotals,
  type TaxRounding,
} from './totals';
export {
  consignmentCommission,
  consignmentCommissionKinds,
  consignmentSettlement,
  milliPercentOf,
  type ConsignmentCommission,
  type ConsignmentCommissionKind,
  type ConsignmentSettlementFigures,
  type ConsignmentSettlementInput,
  type ConsignmentWorkCharge,
} from './consignment';
