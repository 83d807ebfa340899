import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { annualInventoryCost, eoq } from './eoq';

describe('eoq', () => {
  it('reproduces Heizer & Render, Operations Management, ch. 12, example 3: Q* = 200', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 3 (check-values.md):
    // D = 1,000 units/yr, S = $10/order, H = $0.50/unit/yr → Q* = √(2·1000·10/0.5) = √40,000 = 200.
    const input = { annualDemand: 1000, orderCost: 10, holdingCostPerUnitYear: 0.5 };
    expect(eoq(input)).toBe(200);
    // Same chapter, the examples that follow (from memory, re-check): 1000/200 = 5 orders a year,
    // and total ordering + holding cost (1000/200)·10 + (200/2)·0.50 = $100.
    expect(input.annualDemand / eoq(input)).toBe(5);
    expect(annualInventoryCost(200, input)).toBe(100);
  });

  it('reproduces Stevenson, Operations Management, the EOQ example: 300 units, $4,800 a year', () => {
    // Source: Stevenson, *Operations Management*, inventory management chapter, EOQ example (from
    // memory, re-check): D = 9,600 units/yr, H = $16/unit/yr, S = $75 → Q = √90,000 = 300,
    // 32 orders a year, total cost (300/2)·16 + (9600/300)·75 = 2,400 + 2,400 = $4,800.
    const input = { annualDemand: 9600, orderCost: 75, holdingCostPerUnitYear: 16 };
    expect(eoq(input)).toBe(300);
    expect(annualInventoryCost(300, input)).toBe(4800);
  });

  const inputs = fc.record({
    annualDemand: fc.double({ min: 1, max: 1e6, noNaN: true }),
    orderCost: fc.double({ min: 0.01, max: 1e4, noNaN: true }),
    holdingCostPerUnitYear: fc.double({ min: 0.01, max: 1e4, noNaN: true }),
  });

  it('scales with the square root of demand', () => {
    fc.assert(
      fc.property(inputs, fc.double({ min: 0.01, max: 100, noNaN: true }), (input, k) => {
        const scaled = eoq({ ...input, annualDemand: input.annualDemand * k });
        expect(scaled / eoq(input) / Math.sqrt(k)).toBeCloseTo(1, 12);
      }),
    );
  });

  it('balances ordering and holding cost, and no nearby quantity costs less', () => {
    fc.assert(
      fc.property(inputs, fc.double({ min: 0.5, max: 2, noNaN: true }), (input, factor) => {
        const q = eoq(input);
        const ordering = (input.annualDemand / q) * input.orderCost;
        const holding = (q / 2) * input.holdingCostPerUnitYear;
        expect(ordering / holding).toBeCloseTo(1, 9);
        expect(annualInventoryCost(q * factor, input)).toBeGreaterThanOrEqual(annualInventoryCost(q, input) * (1 - 1e-12));
      }),
    );
  });

  it('orders nothing without demand and refuses nonsense', () => {
    expect(eoq({ annualDemand: 0, orderCost: 10, holdingCostPerUnitYear: 1 })).toBe(0);
    expect(() => eoq({ annualDemand: 100, orderCost: 10, holdingCostPerUnitYear: 0 })).toThrow(RangeError);
    expect(() => eoq({ annualDemand: -1, orderCost: 10, holdingCostPerUnitYear: 1 })).toThrow(RangeError);
    expect(() => eoq({ annualDemand: Number.NaN, orderCost: 10, holdingCostPerUnitYear: 1 })).toThrow(RangeError);
    expect(() => annualInventoryCost(0, { annualDemand: 1, orderCost: 1, holdingCostPerUnitYear: 1 })).toThrow(RangeError);
  });
});
