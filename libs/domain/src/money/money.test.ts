import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  divideRoundHalfEven,
  formatMinorUnits,
  formatMoney,
  MoneyFormatError,
  multiplyMinorUnits,
  parseDecimal,
  parseMinorUnits,
  sumMinorUnits,
} from './money';

describe('divideRoundHalfEven', () => {
  it('sends exact ties to the even neighbour, on both sides of zero', () => {
    // IEEE 754-2019 §4.3.1 roundTiesToEven: 0.5 → 0, 1.5 → 2, 2.5 → 2, −1.5 → −2, −2.5 → −2.
    expect(divideRoundHalfEven(1n, 2n)).toBe(0n);
    expect(divideRoundHalfEven(3n, 2n)).toBe(2n);
    expect(divideRoundHalfEven(5n, 2n)).toBe(2n);
    expect(divideRoundHalfEven(-3n, 2n)).toBe(-2n);
    expect(divideRoundHalfEven(-5n, 2n)).toBe(-2n);
    expect(divideRoundHalfEven(5n, -2n)).toBe(-2n);
  });

  it('rounds non-ties to the nearest integer', () => {
    expect(divideRoundHalfEven(7n, 3n)).toBe(2n); // 2.33…
    expect(divideRoundHalfEven(8n, 3n)).toBe(3n); // 2.66…
    expect(divideRoundHalfEven(-8n, 3n)).toBe(-3n);
    expect(divideRoundHalfEven(2501n, 1000n)).toBe(3n); // just above the tie at 2.5
  });

  it('refuses a zero denominator', () => {
    expect(() => divideRoundHalfEven(1n, 0n)).toThrow(RangeError);
  });

  it('agrees with decimal.js ROUND_HALF_EVEN on arbitrary fractions', () => {
    // Independent library: decimal.js (Decimal.ROUND_HALF_EVEN), exact at this precision.
    const D = Decimal.clone({ precision: 60 });
    fc.assert(
      fc.property(
        fc.bigInt({ min: -(10n ** 20n), max: 10n ** 20n }),
        fc.bigInt({ min: 1n, max: 10n ** 6n }),
        (numerator, denominator) => {
          const expected = new D(numerator.toString())
            .div(denominator.toString())
            .toDecimalPlaces(0, D.ROUND_HALF_EVEN)
            .toFixed(0);
          expect(divideRoundHalfEven(numerator, denominator).toString()).toBe(expected === '-0' ? '0' : expected);
        },
      ),
    );
  });
});

describe('parseMinorUnits', () => {
  it('reads decimal text exactly into minor units', () => {
    expect(parseMinorUnits('12.34')).toBe(1234);
    expect(parseMinorUnits('0.1')).toBe(10); // no 0.1 binary error: 10, not 10.000000000000002
    expect(parseMinorUnits('-0.05')).toBe(-5);
    expect(parseMinorUnits('7')).toBe(700);
    expect(parseMinorUnits('12.340')).toBe(1234); // a trailing zero loses nothing
    expect(parseMinorUnits(' 3.5 ')).toBe(350);
    expect(parseMinorUnits('1500', 0)).toBe(1500); // a currency without minor units (yen)
    expect(parseMinorUnits('1.234', 3)).toBe(1234); // three-decimal currencies
  });

  it('refuses digits it would have to round away, and text that is not a decimal', () => {
    const reasonOf = (text: string, exponent?: number) => {
      try {
        parseMinorUnits(text, exponent);
        return 'accepted';
      } catch (error) {
        return error instanceof MoneyFormatError ? error.reason : 'other';
      }
    };
    expect(reasonOf('12.345')).toBe('too_many_decimals');
    expect(reasonOf('12.5', 0)).toBe('too_many_decimals');
    expect(reasonOf('abc')).toBe('not_a_decimal');
    expect(reasonOf('')).toBe('not_a_decimal');
    expect(reasonOf('1e3')).toBe('not_a_decimal');
    expect(reasonOf('1,000.00')).toBe('not_a_decimal');
    expect(reasonOf('99999999999999999')).toBe('out_of_range');
  });

  it('round-trips with formatMinorUnits for every safe amount', () => {
    fc.assert(
      fc.property(fc.integer({ min: -Number.MAX_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER }), fc.constantFrom(0, 2, 3), (minor, exponent) => {
        expect(parseMinorUnits(formatMinorUnits(minor, exponent), exponent)).toBe(minor);
      }),
    );
  });
});

describe('formatMinorUnits and formatMoney', () => {
  it('writes a plain decimal with the currency exponent', () => {
    expect(formatMinorUnits(1234)).toBe('12.34');
    expect(formatMinorUnits(-5)).toBe('-0.05');
    expect(formatMinorUnits(0)).toBe('0.00');
    expect(formatMinorUnits(1500, 0)).toBe('1500');
    expect(() => formatMinorUnits(1.5)).toThrow(RangeError);
  });

  it('uses the locale and the currency exponent from Intl', () => {
    expect(formatMoney(123456, 'GBP', 'en-GB')).toBe('£1,234.56');
    expect(formatMoney(1500, 'JPY', 'en-GB')).toBe('JP¥1,500');
    // The largest safe amount keeps every digit: no float rounding on the way to Intl.
    expect(formatMoney(Number.MAX_SAFE_INTEGER, 'GBP', 'en-GB')).toBe('£90,071,992,547,409.91');
  });
});

describe('multiplyMinorUnits', () => {
  it('rounds half to even at the tie, once', () => {
    expect(multiplyMinorUnits(101, '0.5')).toBe(50); // 50.5 → 50
    expect(multiplyMinorUnits(103, '0.5')).toBe(52); // 51.5 → 52
    expect(multiplyMinorUnits(-103, '0.5')).toBe(-52);
    expect(multiplyMinorUnits(1, 0.5)).toBe(0);
    expect(multiplyMinorUnits(3, 0.5)).toBe(2);
  });

  it('multiplies exactly before it rounds', () => {
    expect(multiplyMinorUnits(1999, 3)).toBe(5997);
    expect(multiplyMinorUnits(1000, '0.333')).toBe(333);
    // 2.3 litres at 25 a litre: in binary floating point 25 * 2.3 is 57.49999999999999 and would
    // round down to 57; the exact product is the tie 57.5, which rounds to the even 58.
    expect(25 * 2.3).toBeLessThan(57.5);
    expect(multiplyMinorUnits(25, 2.3)).toBe(58);
  });
});

describe('parseDecimal and sumMinorUnits', () => {
  it('reads numbers through their shortest decimal', () => {
    expect(parseDecimal(0.1)).toEqual({ coefficient: 1n, scale: 1 });
    expect(parseDecimal('1e-3')).toEqual({ coefficient: 1n, scale: 3 });
    expect(parseDecimal(1.5e21)).toEqual({ coefficient: 1500000000000000000000n, scale: 0 });
    expect(() => parseDecimal(Number.NaN)).toThrow(MoneyFormatError);
  });

  it('sums exactly and refuses an overflowing total', () => {
    expect(sumMinorUnits([10, 20, -5])).toBe(25);
    expect(() => sumMinorUnits([Number.MAX_SAFE_INTEGER, 1])).toThrow(MoneyFormatError);
  });
});
