import fc from 'fast-check';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { demandStats } from './demand-stats';
import { roundToPacks } from './packs';

describe('demandStats', () => {
  it('uses the sample standard deviation (divisor n − 1)', () => {
    // Source: the textbook data set 2, 4, 4, 4, 5, 5, 7, 9 (e.g. the "Standard deviation" article of
    // Wikipedia; from memory, re-check): mean 5, population σ = 2, sample s = √(32/7) ≈ 2.138.
    const stats = demandStats([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(stats.count).toBe(8);
    expect(stats.mean).toBe(5);
    expect(stats.standardDeviation).toBeCloseTo(Math.sqrt(32 / 7), 14);
    expect(stats.standardDeviation).not.toBeCloseTo(2, 3); // not the population formula
  });

  it('agrees with mathjs std (unbiased) and mean', () => {
    // Independent library: mathjs, std(values) with its default 'unbiased' normalisation.
    const math = create(all!);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 500 }), { minLength: 2, maxLength: 400 }), (days) => {
        const stats = demandStats(days);
        expect(stats.mean).toBeCloseTo(math.mean(days) as number, 9);
        expect(stats.standardDeviation!).toBeCloseTo(math.std(days) as unknown as number, 9);
      }),
    );
  });

  it('keeps its precision when demand sits far from zero', () => {
    // Σx² − n·x̄² would cancel catastrophically here; the two-pass form does not.
    expect(demandStats([1e9 + 1, 1e9 + 2, 1e9 + 3]).standardDeviation).toBeCloseTo(1, 9);
  });

  it('estimates no spread from fewer than two periods', () => {
    expect(demandStats([])).toEqual({ count: 0, mean: 0, standardDeviation: null });
    expect(demandStats([7])).toEqual({ count: 1, mean: 7, standardDeviation: null });
    expect(demandStats([0, 0, 0])).toEqual({ count: 3, mean: 0, standardDeviation: 0 });
    expect(() => demandStats([1, Number.NaN])).toThrow(RangeError);
  });
});

describe('roundToPacks', () => {
  it('rounds up to whole packs and to the minimum order', () => {
    expect(roundToPacks(13, { packSize: 6 })).toEqual({ quantity: 18, packs: 3 });
    expect(roundToPacks(12, { packSize: 6 })).toEqual({ quantity: 12, packs: 2 });
    expect(roundToPacks(3, { packSize: 1, minOrderQty: 10 })).toEqual({ quantity: 10, packs: 10 });
    // A minimum that is not whole packs: 25 units at least, in packs of 10 → 30.
    expect(roundToPacks(4, { packSize: 10, minOrderQty: 25 })).toEqual({ quantity: 30, packs: 3 });
    expect(roundToPacks(199.2, { packSize: 1 })).toEqual({ quantity: 200, packs: 200 });
  });

  it('orders nothing when nothing is wanted', () => {
    expect(roundToPacks(0, { packSize: 6, minOrderQty: 10 })).toEqual({ quantity: 0, packs: 0 });
    expect(roundToPacks(-3, { packSize: 6 })).toEqual({ quantity: 0, packs: 0 });
  });

  it('refuses pack rules that make no sense', () => {
    expect(() => roundToPacks(5, { packSize: 0 })).toThrow(RangeError);
    expect(() => roundToPacks(5, { packSize: 2.5 })).toThrow(RangeError);
    expect(() => roundToPacks(5, { packSize: 1, minOrderQty: -1 })).toThrow(RangeError);
    expect(() => roundToPacks(Number.NaN, { packSize: 1 })).toThrow(RangeError);
  });

  it('orders the least whole number of packs covering the wanted quantity and the minimum', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 1e5, noNaN: true }),
        fc.integer({ min: 1, max: 500 }),
        fc.integer({ min: 0, max: 1000 }),
        (wanted, packSize, minOrderQty) => {
          const { quantity, packs } = roundToPacks(wanted, { packSize, minOrderQty });
          const needed = Math.max(wanted, minOrderQty);
          expect(quantity).toBe(packs * packSize);
          expect(quantity).toBeGreaterThanOrEqual(needed);
          expect(quantity - packSize).toBeLessThan(needed); // one pack fewer would not do
        },
      ),
    );
  });
});
