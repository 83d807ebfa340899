import fc from 'fast-check';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { convert, formatMeasurement, isUnitId, kindOf, UNITS, type UnitId } from './units';

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

/** Exact decimal arithmetic on BigInt, to derive the factors from their definitions in the test itself. */
type Exact = { n: bigint; d: bigint };
const dec = (text: string): Exact => {
  const [whole = '', fraction = ''] = text.split('.');
  return { n: BigInt(whole + fraction), d: 10n ** BigInt(fraction.length) };
};
const mul = (a: Exact, b: Exact): Exact => ({ n: a.n * b.n, d: a.d * b.d });
const div = (a: Exact, b: Exact): Exact => ({ n: a.n * b.d, d: a.d * b.n });
/** The double nearest to an exact ratio: 40 significant digits, then JavaScript's correctly rounded parse. */
const toDouble = ({ n, d }: Exact): number => {
  const scaled = (n * 10n ** 40n) / d;
  return Number(`${scaled}e-40`);
};

const INCH_M = dec('0.0254');
const FOOT_M = dec('0.3048');
const POUND_KG = dec('0.45359237');
const STANDARD_GRAVITY = dec('9.80665');
const POUND_FORCE_N = mul(POUND_KG, STANDARD_GRAVITY);

describe('exact factors (NIST SP 811 appendix B; NIST Handbook 44 appendix C)', () => {
  it('uses the defined values of inch, mile, pound, US and imperial gallon', () => {
    // Source: NIST SP 811 appendix B (inch = 2.54 cm, mile = 1.609344 km, pound = 0.45359237 kg,
    // US gallon = 3.785411784 L, all exact); imperial gallon = 4.54609 L exactly (NIST HB 44 appendix C).
    expect(convert(1, 'in', 'mm')).toBe(25.4);
    expect(convert(1, 'mi', 'km')).toBe(1.609344);
    expect(convert(1, 'lb', 'kg')).toBe(0.45359237);
    expect(convert(1, 'gal_us', 'L')).toBe(3.785411784);
    expect(convert(1, 'gal_imp', 'L')).toBe(4.54609);
    expect(convert(1, 'bar', 'kPa')).toBe(100);
  });

  it('derives torque, pressure and power from the pound, standard gravity, foot and inch', () => {
    // Source: NIST SP 811 B.8 defines lbf from the pound and standard gravity 9.80665 m/s²; the
    // values below are computed exactly here and must equal the module's factors to the last bit.
    const lbfFt = mul(POUND_FORCE_N, FOOT_M);
    const psiKPa = div(POUND_FORCE_N, mul(mul(INCH_M, INCH_M), dec('1000')));
    const hpKW = div(mul(dec('550'), lbfFt), dec('1000')); // horsepower = 550 ft·lbf/s
    expect(toDouble(lbfFt)).toBe(UNITS.lbf_ft.factor);
    expect(toDouble(psiKPa)).toBe(UNITS.psi.factor);
    expect(toDouble(hpKW)).toBe(UNITS.hp.factor);
    // The published values in check-values.md, from the same definitions (read from text: their
    // digits go beyond what a double holds, which the linter rightly refuses in a literal).
    expect(convert(1, 'lbf_ft', 'N_m')).toBe(Number('1.3558179483314004'));
    expect(convert(1, 'psi', 'kPa')).toBe(6.894757293168361);
    expect(convert(1, 'hp', 'kW')).toBe(Number('0.74569987158227022'));
  });

  it('matches the rounded conversion factors printed in NIST SP 811 B.8', () => {
    // Source: NIST SP 811 (2008) appendix B.8, 7 significant digits (values from memory, re-check):
    // lbf·ft 1.355 818 N·m, psi 6.894 757 kPa, hp 7.456 999 E+02 W.
    expect(relativeError(convert(1, 'lbf_ft', 'N_m'), 1.355818)).toBeLessThan(5e-7);
    expect(relativeError(convert(1, 'psi', 'kPa'), 6.894757)).toBeLessThan(5e-7);
    expect(relativeError(convert(1, 'hp', 'kW'), 0.7456999)).toBeLessThan(5e-7);
  });
});

describe('agreement with mathjs', () => {
  // Independent library: mathjs. It has no imperial gallon, so it is defined here from its legal value.
  const math = create(all!);
  math.createUnit('impgal', '4.54609 L');
  const cases: [UnitId, UnitId, string, number][] = [
    ['in', 'mm', 'inch to mm', 1e-12],
    ['mi', 'km', 'mile to km', 1e-12],
    ['lb', 'kg', 'lb to kg', 1e-12],
    ['lbf_ft', 'N_m', 'lbf*ft to N m', 1e-12],
    // mathjs defines psi from a rounded pascal value (6.89475729276459 kPa), 6e-11 below the exact
    // figure; the looser tolerance is for mathjs, not for us (the exact derivation above is to the bit).
    ['psi', 'kPa', 'psi to kPa', 1e-10],
    ['bar', 'kPa', 'bar to kPa', 1e-12],
    ['gal_us', 'L', 'gallon to L', 1e-12],
    ['gal_imp', 'L', 'impgal to L', 1e-12],
    // mathjs defines hp as 745.6998715386 W, truncated 4.4e-8 W (5.9e-11 relative) below 550 ft·lbf/s.
    ['hp', 'kW', 'hp to kW', 1e-10],
  ];

  it.each(cases)('%s → %s agrees with mathjs "%s"', (from, to, expression, tolerance) => {
    const theirs = (math.evaluate(`1 ${expression}`) as { toNumber(): number }).toNumber();
    expect(relativeError(convert(1, from, to as never), theirs)).toBeLessThan(tolerance);
    const back = (math.evaluate(`7.5 ${expression.split(' to ')[1]} to ${expression.split(' to ')[0]}`) as { toNumber(): number }).toNumber();
    expect(relativeError(convert(7.5, to, from as never), back)).toBeLessThan(tolerance);
  });
});

describe('convert', () => {
  const unitIds = Object.keys(UNITS) as UnitId[];
  const samePair = fc
    .constantFrom(...unitIds)
    .chain((from) => fc.tuple(fc.constant(from), fc.constantFrom(...unitIds.filter((u) => kindOf(u) === kindOf(from)))));

  it('returns the input after a round trip, within 1e-12 relative', () => {
    fc.assert(
      fc.property(samePair, fc.double({ min: 1e-6, max: 1e9, noNaN: true }), ([from, to], value) => {
        const back = convert(convert(value, from, to as never), to, from as never);
        expect(relativeError(back, value)).toBeLessThan(1e-12);
      }),
      { numRuns: 2000 },
    );
  });

  it('is linear: converting a sum equals summing the conversions', () => {
    fc.assert(
      fc.property(samePair, fc.double({ min: 0, max: 1e6, noNaN: true }), fc.double({ min: 1, max: 1e6, noNaN: true }), ([from, to], a, b) => {
        const whole = convert(a + b, from, to as never);
        const parts = convert(a, from, to as never) + convert(b, from, to as never);
        expect(relativeError(parts, whole)).toBeLessThan(1e-12);
      }),
    );
  });

  it('gives the sanity values of a 1970s 750 cc twin (common practice, rough)', () => {
    // Common practice, no published source: about 50 hp and 400 lb → about 37.3 kW and 181.4 kg.
    expect(convert(50, 'hp', 'kW')).toBeCloseTo(37.3, 1);
    expect(convert(400, 'lb', 'kg')).toBeCloseTo(181.4, 1);
  });

  it('refuses to mix kinds', () => {
    // @ts-expect-error a length cannot become a mass; the type checker refuses it too
    expect(() => convert(1, 'mm', 'kg')).toThrow(TypeError);
    expect(() => convert(1, 'psi', 'L' as never)).toThrow(TypeError);
  });

  it('knows its unit ids', () => {
    expect(isUnitId('psi')).toBe(true);
    expect(isUnitId('furlong')).toBe(false);
    expect(isUnitId('toString')).toBe(false);
    expect(kindOf('gal_imp')).toBe('volume');
  });
});

describe('formatMeasurement', () => {
  it('writes the value, a no-break space and the symbol', () => {
    expect(formatMeasurement(convert(50, 'hp', 'kW'), 'kW')).toBe('37.3\u00a0kW');
    expect(formatMeasurement(convert(400, 'lb', 'kg'), 'kg')).toBe('181.4\u00a0kg');
    expect(formatMeasurement(24, 'lbf_ft')).toBe('24\u00a0lbf·ft');
    expect(formatMeasurement(2.1, 'bar', { minimumFractionDigits: 2, maximumFractionDigits: 2 })).toBe('2.10\u00a0bar');
    expect(formatMeasurement(12345.67, 'mi', { locale: 'de-DE' })).toBe('12.345,7\u00a0mi');
  });
});
