import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Ratio } from './ratio';

describe('Ratio', () => {
  it('keeps lowest terms with a positive denominator', () => {
    expect(Ratio.of(6, 4).toString()).toBe('3/2');
    expect(Ratio.of(3, -6).toString()).toBe('-1/2');
    expect(Ratio.of(0, 5).toString()).toBe('0');
    expect(() => Ratio.of(1, 0)).toThrow(RangeError);
  });

  it('reads numbers as the decimal a person typed', () => {
    expect(Ratio.fromNumber(0.5)?.toString()).toBe('1/2');
    expect(Ratio.fromNumber(0.1)?.toString()).toBe('1/10');
    expect(Ratio.fromNumber(2.25)?.toString()).toBe('9/4');
    expect(Ratio.fromNumber(1e-7)?.toString()).toBe('1/10000000');
    expect(Ratio.fromNumber(1e21)?.toString()).toBe('1000000000000000000000');
    expect(Ratio.fromNumber(-4)?.toString()).toBe('-4');
    expect(Ratio.fromNumber(Number.NaN)).toBeNull();
    expect(Ratio.fromNumber(Number.POSITIVE_INFINITY)).toBeNull();
  });

  it('multiplies, adds and inverts exactly', () => {
    const third = Ratio.of(1, 3);
    expect(third.times(Ratio.of(3)).equals(Ratio.ONE)).toBe(true);
    expect(third.plus(third).plus(third).equals(Ratio.ONE)).toBe(true);
    expect(Ratio.of(2, 7).inverse().toString()).toBe('7/2');
    expect(() => Ratio.ZERO.inverse()).toThrow(RangeError);
  });

  it('property: fromNumber round-trips through toNumber', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e12, max: 1e12 }), (x) => {
        expect(Ratio.fromNumber(x)?.toNumber()).toBe(x === 0 ? 0 : x);
      }),
    );
  });

  it('property: a × b × (1/b) = a', () => {
    const nonZero = fc.tuple(fc.integer({ min: -1000, max: 1000 }).filter((n) => n !== 0), fc.integer({ min: 1, max: 1000 }));
    fc.assert(
      fc.property(nonZero, nonZero, ([an, ad], [bn, bd]) => {
        const a = Ratio.of(an, ad);
        const b = Ratio.of(bn, bd);
        expect(a.times(b).times(b.inverse()).equals(a)).toBe(true);
      }),
    );
  });
});

describe('Ratio.toNumber beyond safe integers', () => {
  it('does not overflow or underflow on large terms', () => {
    expect(Ratio.of(5n, 10n ** 324n).toNumber()).toBe(5e-324);
    expect(Ratio.of(10n ** 400n, 10n ** 399n).toNumber()).toBe(10);
    expect(Ratio.of(-(2n ** 80n), 3n).toNumber()).toBeCloseTo(-(2 ** 80) / 3, -8);
  });
});
