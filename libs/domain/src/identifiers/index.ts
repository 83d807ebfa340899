export { gs1CheckDigit, validateGs1, type Gs1Kind, type Gs1Validation } from './gs1';
export {
  dotWeekStart,
  parseDotDateCode,
  TYRE_ADVISE_FROM_YEARS,
  TYRE_FAIL_FROM_YEARS,
  tyreAgeVerdict,
  tyreAgeYears,
  tyreVerdictForCode,
  type DotDateCode,
  type TyreAgeVerdict,
} from './tyre-date';
export { isSeventeenCharacterVin, validateVin, vinCheckDigit, vinWeightedSum, type VinProblem, type VinValidation } from './vin';
