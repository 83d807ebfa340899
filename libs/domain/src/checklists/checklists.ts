/**
 * Checklist rules: what an inspection item records and what follows from it. Pure functions, no
 * framework. Tappet records what was checked, by whom and when; it never decides that a vehicle is
 * roadworthy: that is for local regulations and licensed practice.
 */
import { tyreAgeYears, tyreVerdictForCode, parseDotDateCode, type TyreAgeVerdict } from '../identifiers/tyre-date';
import { convert, type UnitOf } from '../units/units';

/** The four results an item can record. */
export const itemResults = ['ok', 'advise', 'fail', 'na'] as const;
export type ItemResult = (typeof itemResults)[number];

/** What an item asks for beyond its result. */
export const itemKinds = ['check', 'measure', 'tyre_date', 'compression'] as const;
export type ItemKind = (typeof itemKinds)[number];

/** Safety cautions an item can carry; their wording is in {@link cautionTexts}. */
export const cautionIds = ['fuel_fire', 'brake_fluid', 'rubber_age', 'battery', 'asbestos', 'tyre_age', 'road_test'] as const;
export type CautionId = (typeof cautionIds)[number];

/** Pressure units a compression reading may be entered in. */
export type PressureUnit = UnitOf<'pressure'>;

/** Compression readings are stored in this unit and converted for display by the shop's setting. */
export const COMPRESSION_STORAGE_UNIT: PressureUnit = 'kPa';

/**
 * Tappet's wording for each caution (written for Tappet). Every one ends by deferring to local
 * rules and licensed practice, because the product never certifies a vehicle.
 */
export const cautionTexts: Record<CautionId, { title: string; text: string }> = {
  fuel_fire: {
    title: 'Fuel vapour and fire',
    text: 'Old fuel gives off vapour that ignites easily. Work with the ignition off, in moving air, away from flames, sparks and hot lamps; drain into closed metal containers and keep an extinguisher within reach. Follow local rules on storing and disposing of fuel.',
  },
  brake_fluid: {
    title: 'Brake fluids do not mix',
    text: 'Glycol-based fluids (DOT 3, 4 and 5.1) and silicone fluid (DOT 5) must never be mixed, and mineral fluids belong only in systems built for them. Use the fluid the system was built for, and flush completely when in doubt. Fluid strips paint and harms eyes. Brake work is for competent hands under local rules.',
  },
  rubber_age: {
    title: 'Rubber perishes with age',
    text: 'Hoses, seals, manifold rubbers and tyres harden and crack with age even when a vehicle is never used. New-old-stock rubber from a shelf is aged too: judge it by its age and condition, not by its packaging.',
  },
  battery: {
    title: 'Battery gas and acid',
    text: 'A charging battery gives off hydrogen, which explodes with a spark; the acid burns skin and eyes. Ventilate, wear eye protection, disconnect earth first and reconnect it last.',
  },
  asbestos: {
    title: 'Asbestos in old linings',
    text: 'Brake shoes, pads and clutch plates of older vehicles may contain asbestos. Do not blow or dry-brush the dust: damp it down, bag it, and follow local rules for handling and disposal.',
  },
  tyre_age: {
    title: 'Tyre age',
    text: 'A tyre ages from the day it is made, whatever its tread looks like. Tappet advises from 6 years and fails from 10: common trade practice, not a regulation. Local rules and the tyre maker’s advice come first.',
  },
  road_test: {
    title: 'Road test',
    text: 'Road test only a vehicle that is registered and insured for the road where the law requires it, with brakes and tyres checked first, ridden or driven by a competent person in suitable protective gear.',
  },
};

/** The general note shown with every safety-critical item. */
export const safetyDeferral =
  'This checklist records what was checked, by whom and when. It is not a certificate of roadworthiness: local regulations and licensed practice decide that.';

/** A measurement an item expects, in one unit, with an optional expected range. */
export interface ExpectedRange {
  min?: number | null;
  max?: number | null;
}

/** Where a value sits against its expected range. */
export type RangePosition = 'below' | 'within' | 'above' | 'no_range';

/** Places a value against its range; the bounds are inclusive (a value equal to a bound is within). */
export function rangePosition(value: number, range: ExpectedRange): RangePosition {
  if (!Number.isFinite(value)) throw new RangeError(`Not a measurement: ${value}`);
  const min = range.min ?? null;
  const max = range.max ?? null;
  if (min === null && max === null) return 'no_range';
  if (min !== null && max !== null && min > max) throw new RangeError(`The range ${min}–${max} is upside down.`);
  if (min !== null && value < min) return 'below';
  if (max !== null && value > max) return 'above';
  return 'within';
}

/**
 * The result a measured item suggests: within range → ok, outside → advise, or fail for items
 * whose template says outside the range is a failure. No range → no suggestion.
 */
export function suggestForMeasurement(value: number, range: ExpectedRange, outsideFails: boolean): ItemResult | null {
  const position = rangePosition(value, range);
  if (position === 'no_range') return null;
  if (position === 'within') return 'ok';
  return outsideFails ? 'fail' : 'advise';
}

/** The order of severity: a recorded result may be stricter than the rules suggest, never milder. */
const severity: Record<ItemResult, number> = { na: 0, ok: 1, advise: 2, fail: 3 };

/** The more severe of two results (`na` is the mildest). */
export function worseResult(a: ItemResult, b: ItemResult): ItemResult {
  return severity[a] >= severity[b] ? a : b;
}

/** True when `chosen` is at least as severe as `suggested` (so nothing is marked better than its rule). */
export function isAtLeastAsSevere(chosen: ItemResult, suggested: ItemResult): boolean {
  return severity[chosen] >= severity[suggested];
}

/** What the DOT code of one tyre says. */
export interface TyreDateReading {
  code: string;
  verdict: TyreAgeVerdict | 'unreadable';
  /** Whole and fractional years on the day of the check; null when unreadable. */
  ageYears: number | null;
  /** For a three-digit code: made before 2000 (the decade cannot be known). */
  pre2000: boolean;
}

/**
 * Reads a tyre's DOT date code on `today` (US 49 CFR 574.5: last four digits week and year; a
 * three-digit code means made before 2000 and fails). Limits: advise from 6 years, fail from 10
 * (common practice, see libs/domain identifiers).
 */
export function readTyreDate(code: string, today: Date): TyreDateReading {
  const parsed = parseDotDateCode(code);
  return {
    code,
    verdict: tyreVerdictForCode(code, today),
    ageYears: tyreAgeYears(parsed, today),
    pre2000: parsed.kind === 'pre2000',
  };
}

/** The result a tyre-age item suggests from its readings: the worst tyre decides; an unreadable code suggests nothing. */
export function suggestForTyres(readings: TyreDateReading[]): ItemResult | null {
  if (readings.length === 0 || readings.some((r) => r.verdict === 'unreadable')) return null;
  return readings.map((r) => r.verdict as ItemResult).reduce(worseResult);
}

/** The spread of compression readings across cylinders. */
export interface CompressionSpread {
  lowest: number;
  highest: number;
  /** (highest − lowest) / highest × 100. */
  spreadPercent: number;
}

/**
 * Common practice, no published source: the trade looks for cylinders within about 10 % of each
 * other (measured from the highest); a wider spread is worth telling the customer about.
 */
export const COMPRESSION_SPREAD_ADVISE_PERCENT = 10;

/** Lowest, highest and spread of readings (any one unit). Needs at least one positive reading. */
export function compressionSpread(readings: number[]): CompressionSpread {
  if (readings.length === 0) throw new RangeError('No compression readings.');
  if (readings.some((r) => !Number.isFinite(r) || r < 0)) throw new RangeError('Compression readings are zero or more.');
  const lowest = Math.min(...readings);
  const highest = Math.max(...readings);
  if (highest === 0) return { lowest, highest, spreadPercent: 0 };
  return { lowest, highest, spreadPercent: ((highest - lowest) / highest) * 100 };
}

/**
 * The result compression readings suggest: any cylinder outside the range decides as a
 * measurement does; then a spread above {@link COMPRESSION_SPREAD_ADVISE_PERCENT} advises. A single
 * cylinder has no spread.
 */
export function suggestForCompression(readingsKPa: number[], range: ExpectedRange, outsideFails: boolean): ItemResult | null {
  if (readingsKPa.length === 0) return null;
  let suggestion: ItemResult | null = null;
  for (const r of readingsKPa) {
    const s = suggestForMeasurement(r, range, outsideFails);
    if (s) suggestion = suggestion ? worseResult(suggestion, s) : s;
  }
  if (readingsKPa.length > 1 && compressionSpread(readingsKPa).spreadPercent > COMPRESSION_SPREAD_ADVISE_PERCENT) {
    suggestion = suggestion ? worseResult(suggestion, 'advise') : 'advise';
  }
  return suggestion ?? 'ok';
}

/** A compression reading converted to the storage unit (kPa). */
export function compressionToStorage(value: number, unit: PressureUnit): number {
  return convert(value, unit, COMPRESSION_STORAGE_UNIT);
}

/** A stored compression reading (kPa) in the shop's display unit. */
export function compressionForDisplay(valueKPa: number, unit: PressureUnit): number {
  return convert(valueKPa, COMPRESSION_STORAGE_UNIT, unit);
}

/** An item as the hand-over rule sees it. */
export interface SafetyItemState {
  key: string;
  label: string;
  safety: boolean;
  result: ItemResult | null;
  /** True when the owner signed the item off (with a reason and a record that the customer was told). */
  signedOff: boolean;
}

/** Why an item blocks hand-over. */
export interface HandOverBlocker {
  key: string;
  label: string;
  reason: 'failed' | 'unrecorded';
}

/**
 * Safety-critical items that block marking a job done or a vehicle ready / handed over: failed or
 * not recorded, and not signed off by the owner. `na` counts as recorded (the vehicle has no such
 * part); `advise` does not block.
 */
export function handOverBlockers(items: SafetyItemState[]): HandOverBlocker[] {
  const blockers: HandOverBlocker[] = [];
  for (const item of items) {
    if (!item.safety || item.signedOff) continue;
    if (item.result === null) blockers.push({ key: item.key, label: item.label, reason: 'unrecorded' });
    else if (item.result === 'fail') blockers.push({ key: item.key, label: item.label, reason: 'failed' });
  }
  return blockers;
}
