import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { inverseNormalCdf, normalCdf, zForServiceLevel } from './normal';

describe('zForServiceLevel', () => {
  it('rounds to the z of printed normal tables', () => {
    // Source: the standard normal table as printed in Stevenson, *Operations Management*, appendix
    // (and any statistics text): 90 % → 1.28, 95 % → 1.645 (often printed 1.65), 99 % → 2.33.
    // Tables give 2–3 decimals, so the tolerance is half a unit in the last printed place.
    expect(Math.abs(zForServiceLevel(0.9) - 1.28)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(zForServiceLevel(0.95) - 1.645)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(zForServiceLevel(0.99) - 2.33)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(zForServiceLevel(0.97) - 1.88)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(zForServiceLevel(0.98) - 2.055)).toBeLessThanOrEqual(0.005);
  });

  it('matches the well-known quantiles to 1e-12', () => {
    // Values from memory, re-check (they are quoted to 16 digits in numerical libraries' tests):
    // Φ⁻¹(0.975) = 1.959963984540054, Φ⁻¹(0.95) = 1.6448536269514722, Φ⁻¹(0.99) = 2.3263478740408408.
    expect(zForServiceLevel(0.975)).toBeCloseTo(1.959963984540054, 12);
    expect(zForServiceLevel(0.95)).toBeCloseTo(1.6448536269514722, 12);
    expect(zForServiceLevel(0.99)).toBeCloseTo(2.3263478740408408, 12);
    expect(zForServiceLevel(0.5)).toBe(0);
  });

  it('agrees with jstat to 1e-9 on a grid and on random levels', () => {
    // Independent library: jstat, jStat.normal.inv(p, 0, 1).
    for (let i = 1; i < 10_000; i++) {
      const p = i / 10_000;
      expect(Math.abs(zForServiceLevel(p) - jStat.normal.inv(p, 0, 1))).toBeLessThan(1e-9);
    }
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }), (p) => {
        expect(Math.abs(inverseNormalCdf(p) - jStat.normal.inv(p, 0, 1))).toBeLessThan(1e-9);
      }),
      { numRuns: 2000 },
    );
  });

  it('is antisymmetric and increasing', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-9, max: 0.5, noNaN: true }), fc.double({ min: 1e-9, max: 0.5, noNaN: true }), (p, q) => {
        // Compare at q and 1 − q with q ≥ ½, where 1 − q is exact in binary floating point.
        const upper = 1 - p;
        expect(inverseNormalCdf(upper)).toBeCloseTo(-inverseNormalCdf(1 - upper), 12);
        if (p < q) expect(inverseNormalCdf(p)).toBeLessThanOrEqual(inverseNormalCdf(q));
        if (q > p * (1 + 1e-9)) expect(inverseNormalCdf(p)).toBeLessThan(inverseNormalCdf(q));
      }),
    );
  });

  it('refuses levels outside (0, 1)', () => {
    for (const p of [0, 1, -0.1, 1.5, Number.NaN]) expect(() => zForServiceLevel(p)).toThrow(RangeError);
  });
});

describe('normalCdf', () => {
  it('matches tabulated values', () => {
    // From memory, re-check: Φ(1.96) = 0.9750021048517795, Φ(−3) = 0.0013498980316301, Φ(−5) = 2.866515718791939e-7.
    expect(normalCdf(1.96)).toBeCloseTo(0.9750021048517795, 15);
    expect(normalCdf(-3)).toBeCloseTo(0.0013498980316301, 15);
    expect(Math.abs(normalCdf(-5) / 2.866515718791939e-7 - 1)).toBeLessThan(1e-12);
    expect(normalCdf(0)).toBe(0.5);
  });

  it('agrees with jstat and inverts inverseNormalCdf', () => {
    // Independent library: jstat, jStat.normal.cdf(x, 0, 1).
    fc.assert(
      fc.property(fc.double({ min: -8, max: 8, noNaN: true }), (x) => {
        expect(Math.abs(normalCdf(x) - jStat.normal.cdf(x, 0, 1))).toBeLessThan(1e-14);
      }),
      { numRuns: 2000 },
    );
    fc.assert(
      fc.property(fc.double({ min: 1e-12, max: 0.5, noNaN: true }), (p) => {
        expect(Math.abs(normalCdf(inverseNormalCdf(p)) / p - 1)).toBeLessThan(1e-12);
      }),
      { numRuns: 2000 },
    );
  });
});
