import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { leadTimeDemand, reorderPoint, safetyStock, type LeadTimeDemandModel } from './reorder-point';

/**
 * Textbook answers use a z read from a printed table. Each case is checked twice: with the table z
 * given outright (must match the book to its printed rounding), and with the exact z from the
 * service level (must stay within the stated tolerance of the book's answer).
 */
describe('reorderPoint against textbook examples', () => {
  it('lead-time demand known directly: Stevenson, sand, 3 % stock-out risk → ROP 59.40 tons', () => {
    // Source: Stevenson, *Operations Management*, ch. 12, reorder point example (from memory,
    // re-check): lead-time demand normal with mean 50 tons, σ 5 tons; risk 3 % → table z = 1.88;
    // safety stock 1.88 × 5 = 9.40 tons; ROP = 59.40 tons.
    const model: LeadTimeDemandModel = { kind: 'lead_time_demand', meanLeadTimeDemand: 50, sdLeadTimeDemand: 5 };
    expect(safetyStock(model, { z: 1.88 })).toBeCloseTo(9.4, 10);
    expect(reorderPoint(model, { z: 1.88 })).toBeCloseTo(59.4, 10);
    // Exact z(0.97) = 1.8808: ROP 59.404, within 0.01 of the book.
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.97 }) - 59.4)).toBeLessThan(0.01);
  });

  it('variable demand: Stevenson, sauce, d̄ 50 jars/week, σd 3, LT 2 weeks, 10 % risk → ROP 105.43', () => {
    // Source: Stevenson, *Operations Management*, ch. 12, example with variable demand and constant
    // lead time (from memory, re-check): ROP = 50·2 + 1.28·3·√2 = 100 + 5.43 = 105.43 jars; table z 1.28.
    const model: LeadTimeDemandModel = { kind: 'variable_demand', meanDemandPerPeriod: 50, sdDemandPerPeriod: 3, leadTimePeriods: 2 };
    expect(reorderPoint(model, { z: 1.28 })).toBeCloseTo(105.43, 2);
    // Exact z(0.90) = 1.2816: ROP 105.437, within 0.01 of the book.
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.9 }) - 105.43)).toBeLessThan(0.01);
  });

  it('variable demand: Heizer & Render, ch. 12, example 12, d̄ 15/day, σd 5, LT 2 days, 90 % → ROP ≈ 39', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 12 (from memory, re-check):
    // ROP = 15·2 + 1.28·5·√2 = 30 + 9.05 = 39.05 ≈ 39 units; table z 1.28.
    const model: LeadTimeDemandModel = { kind: 'variable_demand', meanDemandPerPeriod: 15, sdDemandPerPeriod: 5, leadTimePeriods: 2 };
    expect(safetyStock(model, { z: 1.28 })).toBeCloseTo(9.05, 2);
    expect(reorderPoint(model, { z: 1.28 })).toBeCloseTo(39.05, 2);
    // Exact z: 39.062, still 39 when rounded as the book does; tolerance 0.05.
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.9 }) - 39.05)).toBeLessThan(0.05);
  });

  it('variable lead time: Heizer & Render, ch. 12, example 13, d 10/day, L̄T 6 days, σLT 1, 98 % → ROP ≈ 81', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 13 (from memory, re-check):
    // ROP = 10·6 + 2.055·10·1 = 80.55 ≈ 81 units; table z 2.055.
    const model: LeadTimeDemandModel = { kind: 'variable_lead_time', demandPerPeriod: 10, meanLeadTimePeriods: 6, sdLeadTimePeriods: 1 };
    expect(reorderPoint(model, { z: 2.055 })).toBeCloseTo(80.55, 10);
    // Exact z(0.98) = 2.0537: ROP 80.537, within 0.02 of the book.
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.98 }) - 80.55)).toBeLessThan(0.02);
  });

  it('both variable: Heizer & Render, ch. 12, example 14, d̄ 150, σd 16, L̄T 5, σLT 1, 95 % → ROP ≈ 1,004', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 14 (from memory, re-check):
    // σ = √(5·16² + 150²·1²) = √23,780 = 154.2; ROP = 750 + 1.65·154.2 = 1,004.4 ≈ 1,004; table z 1.65.
    const model: LeadTimeDemandModel = {
      kind: 'both_variable',
      meanDemandPerPeriod: 150,
      sdDemandPerPeriod: 16,
      meanLeadTimePeriods: 5,
      sdLeadTimePeriods: 1,
    };
    expect(leadTimeDemand(model).sd).toBeCloseTo(154.2, 1);
    expect(Math.round(reorderPoint(model, { z: 1.65 }))).toBe(1004);
    // Exact z(0.95) = 1.6449 instead of 1.65: ROP 1,003.65, about 0.8 below the book; tolerance 1 unit.
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.95 }) - 1004.4)).toBeLessThan(1);
  });

  it('lead-time demand known directly: Heizer & Render, ch. 12, example 11, mean 350, σ 10, 95 % → ROP 366.5', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 11 (from memory, re-check):
    // safety stock 1.65·10 = 16.5; ROP = 366.5 ≈ 367 kits; table z 1.65.
    const model: LeadTimeDemandModel = { kind: 'lead_time_demand', meanLeadTimeDemand: 350, sdLeadTimeDemand: 10 };
    expect(safetyStock(model, { z: 1.65 })).toBeCloseTo(16.5, 10);
    expect(reorderPoint(model, { z: 1.65 })).toBeCloseTo(366.5, 10);
    // Exact z: 366.45; tolerance 0.06 (the difference of 1.65 and 1.6449, times σ = 10).
    expect(Math.abs(reorderPoint(model, { serviceLevel: 0.95 }) - 366.5)).toBeLessThan(0.06);
  });
});

describe('reorderPoint properties', () => {
  const positive = fc.double({ min: 0.01, max: 1000, noNaN: true });
  const models: fc.Arbitrary<LeadTimeDemandModel> = fc.oneof(
    fc.record({ kind: fc.constant('variable_demand' as const), meanDemandPerPeriod: positive, sdDemandPerPeriod: positive, leadTimePeriods: positive }),
    fc.record({ kind: fc.constant('variable_lead_time' as const), demandPerPeriod: positive, meanLeadTimePeriods: positive, sdLeadTimePeriods: positive }),
    fc.record({
      kind: fc.constant('both_variable' as const),
      meanDemandPerPeriod: positive,
      sdDemandPerPeriod: positive,
      meanLeadTimePeriods: positive,
      sdLeadTimePeriods: positive,
    }),
  );
  const level = fc.double({ min: 0.5, max: 0.9999, noNaN: true });

  it('grows with the service level', () => {
    fc.assert(
      fc.property(models, level, level, (model, a, b) => {
        fc.pre(a < b);
        const lower = reorderPoint(model, { serviceLevel: a });
        const higher = reorderPoint(model, { serviceLevel: b });
        expect(lower).toBeLessThanOrEqual(higher);
        // Strictly, once the levels differ by more than floating-point noise can hide.
        if (b - a >= 0.001) expect(lower).toBeLessThan(higher);
      }),
    );
  });

  it('holds no safety stock at a 50 % service level', () => {
    fc.assert(
      fc.property(models, (model) => {
        expect(safetyStock(model, { serviceLevel: 0.5 })).toBe(0);
      }),
    );
  });

  it('reduces the combined formula to the single-source ones when the other spread is zero', () => {
    fc.assert(
      fc.property(positive, positive, positive, positive, level, (d, sd, lt, sdLt, p) => {
        const target = { serviceLevel: p };
        const both = (sdDemand: number, sdLeadTime: number) =>
          reorderPoint(
            { kind: 'both_variable', meanDemandPerPeriod: d, sdDemandPerPeriod: sdDemand, meanLeadTimePeriods: lt, sdLeadTimePeriods: sdLeadTime },
            target,
          );
        const variableDemand = reorderPoint({ kind: 'variable_demand', meanDemandPerPeriod: d, sdDemandPerPeriod: sd, leadTimePeriods: lt }, target);
        const variableLeadTime = reorderPoint(
          { kind: 'variable_lead_time', demandPerPeriod: d, meanLeadTimePeriods: lt, sdLeadTimePeriods: sdLt },
          target,
        );
        // Relative, not absolute: reorder points reach about 10^6 here, where one rounding step of a
        // double is already about 10^-10, so a fixed 9 decimal places failed on unlucky draws.
        const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(b)));
        close(both(sd, 0), variableDemand);
        close(both(0, sdLt), variableLeadTime);
      }),
    );
  });

  it('refuses negative or non-finite inputs', () => {
    const given = (mean: number, sd: number): LeadTimeDemandModel => ({ kind: 'lead_time_demand', meanLeadTimeDemand: mean, sdLeadTimeDemand: sd });
    const negativeDemand: LeadTimeDemandModel = { kind: 'variable_demand', meanDemandPerPeriod: -1, sdDemandPerPeriod: 1, leadTimePeriods: 1 };
    expect(() => reorderPoint(negativeDemand, { z: 1 })).toThrow(RangeError);
    expect(() => reorderPoint(given(1, Number.NaN), { z: 1 })).toThrow(RangeError);
    expect(() => reorderPoint(given(1, 1), { z: Number.POSITIVE_INFINITY })).toThrow(RangeError);
    expect(() => reorderPoint(given(1, 1), { serviceLevel: 1 })).toThrow(RangeError);
  });
});

/**
 * An independent check of the textbook figures above (which are from memory): jstat's inverse
 * normal (`jStat.normal.inv`, a registry library that shares no code with ours) gives the z each
 * book reads from its table, to the table's rounding, and the reorder point rebuilt by hand from
 * the three textbook formulas with that z agrees with ours to 1e-9.
 */
describe('the textbook examples rebuilt with jstat', () => {
  const examples: Array<{ name: string; p: number; tableZ: number; mean: number; sigma: number; model: LeadTimeDemandModel }> = [
    { name: 'Stevenson, sand (3 % risk)', p: 0.97, tableZ: 1.88, mean: 50, sigma: 5, model: { kind: 'lead_time_demand', meanLeadTimeDemand: 50, sdLeadTimeDemand: 5 } },
    { name: 'Stevenson, sauce (10 % risk)', p: 0.9, tableZ: 1.28, mean: 100, sigma: 3 * Math.sqrt(2), model: { kind: 'variable_demand', meanDemandPerPeriod: 50, sdDemandPerPeriod: 3, leadTimePeriods: 2 } },
    { name: 'Heizer & Render ex. 12', p: 0.9, tableZ: 1.28, mean: 30, sigma: 5 * Math.sqrt(2), model: { kind: 'variable_demand', meanDemandPerPeriod: 15, sdDemandPerPeriod: 5, leadTimePeriods: 2 } },
    { name: 'Heizer & Render ex. 13', p: 0.98, tableZ: 2.055, mean: 60, sigma: 10 * 1, model: { kind: 'variable_lead_time', demandPerPeriod: 10, meanLeadTimePeriods: 6, sdLeadTimePeriods: 1 } },
    {
      name: 'Heizer & Render ex. 14',
      p: 0.95,
      tableZ: 1.65,
      mean: 750,
      sigma: Math.sqrt(5 * 16 ** 2 + 150 ** 2 * 1 ** 2),
      model: { kind: 'both_variable', meanDemandPerPeriod: 150, sdDemandPerPeriod: 16, meanLeadTimePeriods: 5, sdLeadTimePeriods: 1 },
    },
    { name: 'Heizer & Render ex. 11', p: 0.95, tableZ: 1.65, mean: 350, sigma: 10, model: { kind: 'lead_time_demand', meanLeadTimeDemand: 350, sdLeadTimeDemand: 10 } },
  ];

  for (const e of examples) {
    it(`${e.name}: the table z is jstat's to the table's rounding, and ROP = mean + z·σ`, () => {
      const z = jStat.normal.inv(e.p, 0, 1);
      // Printed tables give z to two places (1.65 for 95 % sits between 1.64 and 1.65; 2.055 is
      // the midpoint a book prints for 98 %): within 0.006 of the exact value.
      expect(Math.abs(z - e.tableZ)).toBeLessThan(0.006);
      expect(leadTimeDemand(e.model).mean).toBeCloseTo(e.mean, 10);
      expect(leadTimeDemand(e.model).sd).toBeCloseTo(e.sigma, 10);
      expect(Math.abs(reorderPoint(e.model, { serviceLevel: e.p }) - (e.mean + z * e.sigma))).toBeLessThan(1e-9);
    });
  }
});
