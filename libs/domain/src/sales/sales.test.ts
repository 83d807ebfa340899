import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { divideRoundHalfAway } from './rounding';
import { defaultPricingRules, roundSellPrice, sellPrice, type PricingRules } from './pricing';
import { documentTotals, lineNetMinor } from './totals';

describe('divideRoundHalfAway', () => {
  it('sends ties away from zero and everything else to the nearest integer', () => {
    expect(divideRoundHalfAway(1n, 2n)).toBe(1n); // 0.5 → 1
    expect(divideRoundHalfAway(5n, 2n)).toBe(3n); // 2.5 → 3 (half-even would give 2)
    expect(divideRoundHalfAway(-5n, 2n)).toBe(-3n);
    expect(divideRoundHalfAway(5n, -2n)).toBe(-3n);
    expect(divideRoundHalfAway(7n, 3n)).toBe(2n);
    expect(divideRoundHalfAway(-8n, 3n)).toBe(-3n);
    expect(() => divideRoundHalfAway(1n, 0n)).toThrow(RangeError);
  });

  it('agrees with decimal.js ROUND_HALF_UP (which rounds ties away from zero)', () => {
    // Independent library: decimal.js, whose ROUND_HALF_UP mode rounds ties away from zero.
    const D = Decimal.clone({ precision: 60 });
    fc.assert(
      fc.property(fc.bigInt({ min: -(10n ** 18n), max: 10n ** 18n }), fc.bigInt({ min: 1n, max: 10n ** 6n }), (n, d) => {
        const expected = new D(n.toString()).div(d.toString()).toDecimalPlaces(0, D.ROUND_HALF_UP).toFixed(0);
        expect(divideRoundHalfAway(n, d).toString()).toBe(expected === '-0' ? '0' : expected);
      }),
    );
  });
});

describe('sellPrice', () => {
  const rules: PricingRules = {
    useListPrice: true,
    defaultMarkupPercent: 40,
    categoryMarkups: { 'Brake hydraulics': 55 },
    originMarkups: { reproduction: 30 },
    rounding: 'none',
  };

  it('uses the list price when the part has one and the shop uses list prices', () => {
    expect(sellPrice({ listPriceMinor: 2450, unitCostMinor: 1000, category: null, origin: null }, rules)).toEqual({
      unitMinor: 2450,
      basis: 'list',
      markupPercent: null,
    });
    const costPlus = sellPrice({ listPriceMinor: 2450, unitCostMinor: 1000, category: null, origin: null }, { ...rules, useListPrice: false });
    expect(costPlus).toEqual({ unitMinor: 1400, basis: 'default-markup', markupPercent: 40 });
  });

  it('takes the category markup before the origin markup, and the origin before the default', () => {
    // Worked by hand: 12.34 × 1.55 = 19.127 → 19.13; × 1.30 = 16.042 → 16.04; × 1.40 = 17.276 → 17.28.
    const base = { listPriceMinor: null, unitCostMinor: 1234 };
    expect(sellPrice({ ...base, category: ' brake HYDRAULICS', origin: 'reproduction' }, rules)).toMatchObject({ unitMinor: 1913, basis: 'category-markup' });
    expect(sellPrice({ ...base, category: 'Ignition', origin: 'reproduction' }, rules)).toMatchObject({ unitMinor: 1604, basis: 'origin-markup' });
    expect(sellPrice({ ...base, category: null, origin: 'genuine' }, rules)).toMatchObject({ unitMinor: 1728, basis: 'default-markup' });
  });

  it('prices a fractional moving-average cost exactly, rounding once', () => {
    // 10.005 pence-fraction cost: 1000.5 minor × 1.40 = 1400.7 → 1401.
    expect(sellPrice({ listPriceMinor: null, unitCostMinor: 1000.5, category: null, origin: null }, rules).unitMinor).toBe(1401);
    // A tie: 1.25 minor × 1.40 = 1.75 → 2; 0.25 × 1.40 = 0.35 → 0. And 125 × 1.3 = 162.5 → 163 (away from zero).
    expect(sellPrice({ listPriceMinor: null, unitCostMinor: 125, category: null, origin: 'reproduction' }, rules).unitMinor).toBe(163);
  });

  it('has no price without a list price or a cost', () => {
    expect(sellPrice({ listPriceMinor: null, unitCostMinor: null, category: null, origin: null }, defaultPricingRules)).toEqual({
      unitMinor: null,
      basis: 'no-price',
      markupPercent: null,
    });
  });

  it('rounds only upwards, to the shop’s step or to a price ending in 99', () => {
    expect(roundSellPrice(1234, 'none')).toBe(1234);
    expect(roundSellPrice(1234, 'up-to-5')).toBe(1235);
    expect(roundSellPrice(1235, 'up-to-5')).toBe(1235);
    expect(roundSellPrice(1231, 'up-to-10')).toBe(1240);
    expect(roundSellPrice(1201, 'up-to-50')).toBe(1250);
    expect(roundSellPrice(1201, 'up-to-100')).toBe(1300);
    expect(roundSellPrice(1234, 'whole-minus-1')).toBe(1299);
    expect(roundSellPrice(1300, 'whole-minus-1')).toBe(1399);
    expect(roundSellPrice(1299, 'whole-minus-1')).toBe(1299);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000_000 }), fc.constantFrom('up-to-5', 'up-to-10', 'up-to-50', 'up-to-100', 'whole-minus-1' as const), (minor, rounding) => {
        const rounded = roundSellPrice(minor, rounding);
        expect(rounded).toBeGreaterThanOrEqual(minor);
        expect(rounded - minor).toBeLessThan(100);
      }),
    );
  });
});

describe('documentTotals', () => {
  it('matches a worked example with two tax rates, hours and a discount', () => {
    // Worked by hand (shop currency with two decimals):
    //   A  2 × 45.50 at 20 %            net  91.00   tax 18.20
    //   B  1.5 h × 60.00 at 20 %         net  90.00   tax 18.00
    //   C  1 × 12.49 at 5 %              net  12.49   tax 0.6245 → 0.62
    //   D  2 × 12.35 less 10 % at 20 %   net  22.23   tax 4.446 → 4.45 (per line) | in the 20 % sum
    // per line:     tax 18.20 + 18.00 + 0.62 + 4.45 = 41.27
    // per document: 20 %: (91.00 + 90.00 + 22.23) × 0.2 = 40.646 → 40.65; 5 %: 0.62 → tax 41.27
    const lines = [
      { quantity: 2, unitPriceMinor: 4550, taxRatePercent: 20 },
      { quantity: '1.5', unitPriceMinor: 6000, taxRatePercent: 20 },
      { quantity: 1, unitPriceMinor: 1249, taxRatePercent: 5 },
      { quantity: 2, unitPriceMinor: 1235, discountPercent: 10, taxRatePercent: 20 },
    ];
    const perLine = documentTotals(lines, 'per-line');
    expect(perLine.lines.map((l) => [l.netMinor, l.taxMinor])).toEqual([
      [9100, 1820],
      [9000, 1800],
      [1249, 62],
      [2223, 445],
    ]);
    expect(perLine).toMatchObject({ netMinor: 21572, taxMinor: 4127, grossMinor: 25699 });
    expect(perLine.taxByRate).toEqual([
      { ratePercent: 20, netMinor: 20323, taxMinor: 4065 },
      { ratePercent: 5, netMinor: 1249, taxMinor: 62 },
    ]);
    const perDocument = documentTotals(lines, 'per-document');
    expect(perDocument.taxByRate).toEqual([
      { ratePercent: 20, netMinor: 20323, taxMinor: 4065 },
      { ratePercent: 5, netMinor: 1249, taxMinor: 62 },
    ]);
    expect(perDocument.taxMinor).toBe(4127);
  });

  it('shows where the two tax roundings part: three lines of 1.99 at 20 %', () => {
    // By hand: each line's tax 0.398 → 0.40, so 1.20 per line; once on the total, 5.97 × 0.2 = 1.194 → 1.19.
    const lines = Array.from({ length: 3 }, () => ({ quantity: 1, unitPriceMinor: 199, taxRatePercent: 20 }));
    expect(documentTotals(lines, 'per-line')).toMatchObject({ netMinor: 597, taxMinor: 120, grossMinor: 717 });
    expect(documentTotals(lines, 'per-document')).toMatchObject({ netMinor: 597, taxMinor: 119, grossMinor: 716 });
  });

  it('rounds a half-penny of tax away from zero, on invoices and credit lines alike', () => {
    // 0.10 at 5 % = 0.005 → 0.01; the same line credited → −0.01.
    expect(documentTotals([{ quantity: 1, unitPriceMinor: 10, taxRatePercent: 5 }], 'per-line').taxMinor).toBe(1);
    expect(documentTotals([{ quantity: -1, unitPriceMinor: 10, taxRatePercent: 5 }], 'per-line').taxMinor).toBe(-1);
  });

  it('handles a fractional tax rate and an empty document', () => {
    // 100.00 at 8.875 % = 8.875 → 8.88.
    expect(documentTotals([{ quantity: 1, unitPriceMinor: 10000, taxRatePercent: 8.875 }], 'per-document').taxMinor).toBe(888);
    expect(documentTotals([], 'per-line')).toEqual({ lines: [], netMinor: 0, taxMinor: 0, grossMinor: 0, taxByRate: [] });
  });

  it('refuses discounts outside 0–100 % and fractional unit prices', () => {
    expect(() => lineNetMinor({ quantity: 1, unitPriceMinor: 100, discountPercent: 101 })).toThrow(RangeError);
    expect(() => lineNetMinor({ quantity: 1, unitPriceMinor: 100, discountPercent: -1 })).toThrow(RangeError);
    expect(() => lineNetMinor({ quantity: 1, unitPriceMinor: 10.5 })).toThrow(RangeError);
  });

  it('agrees with decimal.js on arbitrary lines, and gross is always net plus tax', () => {
    // Independent library: decimal.js with ROUND_HALF_UP (ties away from zero).
    const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_UP });
    const line = fc.record({
      quantity: fc.integer({ min: -5000, max: 50000 }).map((q) => (q / 100).toString()),
      unitPriceMinor: fc.integer({ min: 0, max: 5_000_000 }),
      discountPercent: fc.integer({ min: 0, max: 1000 }).map((d) => d / 10),
      taxRatePercent: fc.constantFrom(0, 5, 12.5, 20, 8.875),
    });
    fc.assert(
      fc.property(fc.array(line, { maxLength: 12 }), fc.constantFrom('per-line' as const, 'per-document' as const), (lines, rounding) => {
        const totals = documentTotals(lines, rounding);
        let expectedTax = new D(0);
        const nets = lines.map((l) =>
          new D(l.quantity).mul(l.unitPriceMinor).mul(new D(100).minus(l.discountPercent)).div(100).toDecimalPlaces(0),
        );
        if (rounding === 'per-line') {
          lines.forEach((l, i) => (expectedTax = expectedTax.plus(nets[i]!.mul(l.taxRatePercent).div(100).toDecimalPlaces(0))));
        } else {
          for (const rate of new Set(lines.map((l) => l.taxRatePercent))) {
            const net = lines.reduce((sum, l, i) => (l.taxRatePercent === rate ? sum.plus(nets[i]!) : sum), new D(0));
            expectedTax = expectedTax.plus(net.mul(rate).div(100).toDecimalPlaces(0));
          }
        }
        expect(totals.netMinor).toBe(nets.reduce((s, n) => s.plus(n), new D(0)).toNumber());
        expect(totals.taxMinor).toBe(expectedTax.toNumber());
        expect(totals.grossMinor).toBe(totals.netMinor + totals.taxMinor);
      }),
    );
  });
});
