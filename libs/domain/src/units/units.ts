/**
 * Unit conversions for the measurements a restoration shop records: lengths on drawings, odometer
 * distances, weights, torque settings, tyre pressures, fluid volumes and engine power.
 *
 * Each unit is a factor to one reference unit of its kind. The factors are exact by definition
 * (NIST SP 811 appendix B; NIST Handbook 44 appendix C) or follow exactly from exact definitions:
 * - inch = 25.4 mm; mile = 1.609344 km; pound = 0.45359237 kg (international yard and pound, 1959);
 * - pound-force = 0.45359237 kg × 9.80665 m/s² (standard gravity) = 4.4482216152605 N, so
 *   lbf·ft = 4.4482216152605 N × 0.3048 m = 1.3558179483314004 N·m exactly, and
 *   psi = 4.4482216152605 N / (0.0254 m)² = 6894.757293168361… Pa (a repeating decimal, shown to
 *   double precision);
 * - mechanical horsepower = 550 ft·lbf/s = 745.69987158227022 W exactly;
 * - US gallon = 231 in³ = 3.785411784 L; imperial gallon = 4.54609 L (UK Weights and Measures Act
 *   1985); bar = 100 kPa.
 */

interface UnitDefinition {
  readonly kind: string;
  /** How many reference units of the kind one of this unit is. */
  readonly factor: number;
  /** The symbol written after a value (SI style: a space between number and symbol). */
  readonly symbol: string;
}

/** Every unit Tappet converts, by id. The reference unit of each kind has factor 1. */
export const UNITS = {
  mm: { kind: 'length', factor: 1, symbol: 'mm' },
  in: { kind: 'length', factor: 25.4, symbol: 'in' },
  km: { kind: 'distance', factor: 1, symbol: 'km' },
  mi: { kind: 'distance', factor: 1.609344, symbol: 'mi' },
  kg: { kind: 'mass', factor: 1, symbol: 'kg' },
  lb: { kind: 'mass', factor: 0.45359237, symbol: 'lb' },
  N_m: { kind: 'torque', factor: 1, symbol: 'N·m' },
  // 1.3558179483314004 N·m exactly; the literal is the nearest double, written as JavaScript prints it.
  lbf_ft: { kind: 'torque', factor: 1.3558179483314003, symbol: 'lbf·ft' },
  kPa: { kind: 'pressure', factor: 1, symbol: 'kPa' },
  psi: { kind: 'pressure', factor: 6.894757293168361, symbol: 'psi' },
  bar: { kind: 'pressure', factor: 100, symbol: 'bar' },
  L: { kind: 'volume', factor: 1, symbol: 'L' },
  gal_us: { kind: 'volume', factor: 3.785411784, symbol: 'US gal' },
  gal_imp: { kind: 'volume', factor: 4.54609, symbol: 'imp gal' },
  kW: { kind: 'power', factor: 1, symbol: 'kW' },
  // 745.69987158227022 W exactly; the literal is that value's nearest double, in kW.
  hp: { kind: 'power', factor: 0.7456998715822702, symbol: 'hp' },
} as const satisfies Record<string, UnitDefinition>;

type UnitTable = typeof UNITS;

/** A unit id such as 'mm', 'lbf_ft', 'gal_imp'. */
export type UnitId = keyof UnitTable;

/** The kinds of quantity: length, distance, mass, torque, pressure, volume, power. */
export type QuantityKind = UnitTable[UnitId]['kind'];

/** The unit ids of one kind, e.g. `UnitOf<'pressure'>` = 'kPa' | 'psi' | 'bar'. */
export type UnitOf<K extends QuantityKind> = { [U in UnitId]: UnitTable[U]['kind'] extends K ? U : never }[UnitId];

/** True when `value` names a unit Tappet knows (for ids read from settings or the database). */
export function isUnitId(value: string): value is UnitId {
  return Object.prototype.hasOwnProperty.call(UNITS, value);
}

/** The kind of quantity a unit measures. */
export function kindOf(unit: UnitId): QuantityKind {
  return UNITS[unit].kind;
}

/**
 * Converts a value between two units of the same kind: `convert(1, 'lbf_ft', 'N_m')` →
 * 1.3558179483314004 (printed by JavaScript as …003, the same double). The types refuse mixing
 * kinds; at run time a mismatch throws a TypeError.
 */
export function convert<F extends UnitId>(value: number, from: F, to: UnitOf<UnitTable[F]['kind']>): number {
  const source: UnitDefinition = UNITS[from];
  const target: UnitDefinition = UNITS[to];
  if (source.kind !== target.kind) throw new TypeError(`Cannot convert ${source.kind} (${from}) to ${target.kind} (${to})`);
  if ((from as UnitId) === to) return value; // no round-off for a no-op
  return (value * source.factor) / target.factor;
}

/** Options for formatMeasurement. */
export interface FormatMeasurementOptions {
  /** BCP 47 locale for digits and separators; default 'en-GB'. */
  locale?: string;
  /** Most decimals shown; default 1. */
  maximumFractionDigits?: number;
  /** Fewest decimals shown; default 0. */
  minimumFractionDigits?: number;
}

/**
 * Writes a measurement for people: the number in the locale's style, a no-break space (so the pair
 * never wraps apart), then the unit symbol: `formatMeasurement(37.28, 'kW')` → "37.3 kW".
 */
export function formatMeasurement(value: number, unit: UnitId, options: FormatMeasurementOptions = {}): string {
  const { locale = 'en-GB', maximumFractionDigits = 1, minimumFractionDigits = 0 } = options;
  const number = new Intl.NumberFormat(locale, { maximumFractionDigits, minimumFractionDigits }).format(value);
  return `${number}\u00a0${UNITS[unit].symbol}`;
}
