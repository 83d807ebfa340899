export {
  convert,
  formatMeasurement,
  isUnitId,
  kindOf,
  UNITS,
  type FormatMeasurementOptions,
  type QuantityKind,
  type UnitId,
  type UnitOf,
} from './units';
