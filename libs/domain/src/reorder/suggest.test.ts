import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decideReorder, substituteSupply, type ReorderInput } from './suggest';

const base: ReorderInput = {
  meanDemandPerDay: 15,
  sdDemandPerDay: 5,
  leadTimeDays: 2,
  sdLeadTimeDays: null,
  service: { z: 1.28 },
  orderCostMinor: 0,
  holdingRatePerYear: 0.25,
  unitCostMinor: null,
  stockPosition: 10,
  pack: { packSize: 1 },
};

describe('decideReorder against textbook examples', () => {
  it('variable demand: Heizer & Render, ch. 12, example 12 — ROP 39.05, order back up to it', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 12 (from memory, re-check):
    // d̄ 15/day, σd 5, LT 2 days, table z 1.28 → safety stock 9.05, ROP 39.05. Table-z convention, tolerance 0.01.
    const d = decideReorder(base)!;
    expect(d.model).toBe('variable_demand');
    expect(d.safetyStock).toBeCloseTo(9.05, 2);
    expect(d.reorderPoint).toBeCloseTo(39.05, 2);
    // No unit cost, so no EOQ: 39.05 − 10 = 29.05 wanted, 30 ordered in single units.
    expect(d.eoq).toBeNull();
    expect(d.wanted).toBeCloseTo(29.05, 2);
    expect(d.quantity).toBe(30);
  });

  it('variable lead time: Heizer & Render, ch. 12, example 13 — ROP 80.55', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 13 (from memory, re-check):
    // d 10/day steady, L̄T 6 days, σLT 1 day, table z 2.055 → ROP 60 + 20.55 = 80.55. Tolerance 1e-9.
    const d = decideReorder({ ...base, meanDemandPerDay: 10, sdDemandPerDay: 0, leadTimeDays: 6, sdLeadTimeDays: 1, service: { z: 2.055 }, stockPosition: 80 })!;
    expect(d.model).toBe('variable_lead_time');
    expect(d.reorderPoint).toBeCloseTo(80.55, 9);
    expect(d.quantity).toBe(1);
  });

  it('both variable: Heizer & Render, ch. 12, example 14 — ROP ≈ 1,004; exact z(0.95) within 1 unit', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 14 (from memory, re-check):
    // d̄ 150, σd 16, L̄T 5, σLT 1, table z 1.65 → σ = √(5·16² + 150²) = 154.2, ROP 1,004.4.
    const input = { ...base, meanDemandPerDay: 150, sdDemandPerDay: 16, leadTimeDays: 5, sdLeadTimeDays: 1, stockPosition: 2000 };
    const table = decideReorder({ ...input, service: { z: 1.65 } })!;
    expect(table.model).toBe('both_variable');
    expect(Math.round(table.reorderPoint)).toBe(1004);
    expect(table.quantity).toBe(0);
    const exact = decideReorder({ ...input, service: { serviceLevel: 0.95 } })!;
    expect(Math.abs(exact.reorderPoint - 1004.4)).toBeLessThan(1);
  });

  it('orders the EOQ when it is larger: Heizer & Render, ch. 12, example 3 — Q* = 200', () => {
    // Source: Heizer & Render, *Operations Management*, ch. 12, example 3 (check-values.md): D = 1,000/yr,
    // S = $10, H = $0.50 → Q* = 200. Here D = 365 · (1000/365), S = 10, H = unit cost 2 × 25 %.
    const d = decideReorder({ ...base, meanDemandPerDay: 1000 / 365, sdDemandPerDay: 0, orderCostMinor: 10, unitCostMinor: 2, holdingRatePerYear: 0.25, stockPosition: 0 })!;
    expect(d.eoq).toBeCloseTo(200, 9);
    expect(d.quantity).toBe(200);
    expect(d.reasons.some((r) => r.includes('order the economic order quantity, 200'))).toBe(true);
  });
});

describe('decideReorder without history', () => {
  it('uses a manual minimum and maximum, and nothing without them', () => {
    const none = { ...base, meanDemandPerDay: 0, sdDemandPerDay: 0, stockPosition: 1 };
    expect(decideReorder(none)).toBeNull();
    expect(decideReorder({ ...none, manual: { min: 2, max: 10 } })).toMatchObject({ method: 'min_max', quantity: 9, reorderPoint: 2 });
    expect(decideReorder({ ...none, stockPosition: 3, manual: { min: 2, max: 10 } })).toMatchObject({ quantity: 0 });
    // Without a maximum, the minimum is the target; packs of 4 round 1 up to 4.
    expect(decideReorder({ ...none, stockPosition: 1, manual: { min: 2, max: null }, pack: { packSize: 4 } })).toMatchObject({ wanted: 1, quantity: 4 });
  });
});

describe('decideReorder properties', () => {
  const inputs = fc.record({
    meanDemandPerDay: fc.double({ min: 0.01, max: 500, noNaN: true }),
    sdDemandPerDay: fc.option(fc.double({ min: 0, max: 200, noNaN: true })),
    leadTimeDays: fc.double({ min: 0, max: 120, noNaN: true }),
    sdLeadTimeDays: fc.option(fc.double({ min: 0, max: 30, noNaN: true })),
    service: fc.double({ min: 0.5, max: 0.999, noNaN: true }).map((serviceLevel) => ({ serviceLevel })),
    orderCostMinor: fc.integer({ min: 0, max: 100_000 }),
    // The shop setting allows 0 % to 100 % in steps of 0.001 %.
    holdingRatePerYear: fc.oneof(fc.constant(0), fc.double({ min: 0.00001, max: 1, noNaN: true })),
    unitCostMinor: fc.option(fc.integer({ min: 0, max: 1_000_000 })),
    stockPosition: fc.double({ min: 0, max: 100_000, noNaN: true }),
    pack: fc.record({ packSize: fc.integer({ min: 1, max: 50 }), minOrderQty: fc.integer({ min: 0, max: 200 }) }),
  });

  it('orders whole packs, at least the minimum, enough to reach the reorder point — and nothing above it', () => {
    fc.assert(
      fc.property(inputs, (input) => {
        const d = decideReorder(input)!;
        expect(d.quantity % input.pack.packSize).toBe(0);
        if (input.stockPosition > d.reorderPoint) expect(d.quantity).toBe(0);
        else {
          expect(d.quantity).toBeGreaterThanOrEqual(input.pack.minOrderQty);
          expect(input.stockPosition + d.quantity).toBeGreaterThanOrEqual(d.reorderPoint - 1e-9);
          if (d.eoq !== null) expect(d.quantity).toBeGreaterThanOrEqual(d.eoq - 1e-9);
        }
      }),
    );
  });

  it('never orders more for a higher stock position', () => {
    fc.assert(
      fc.property(inputs, fc.double({ min: 0, max: 1000, noNaN: true }), (input, more) => {
        const low = decideReorder(input)!;
        const high = decideReorder({ ...input, stockPosition: input.stockPosition + more })!;
        expect(high.quantity).toBeLessThanOrEqual(low.quantity);
      }),
    );
  });
});

describe('substituteSupply', () => {
  it('counts a both-ways part fully and a one-way predecessor only up to its own demand', () => {
    // 40 of a one-way predecessor, its own demand 14 over the lead time → 14; 20 of a both-ways part at 2 per unit → 10.
    expect(substituteSupply([{ free: 40, unitsPerDemandUnit: 1, scope: 'own_demand_only', ownDemand: 14 }])).toBe(14);
    expect(substituteSupply([{ free: 20, unitsPerDemandUnit: 2, scope: 'full' }])).toBe(10);
    expect(substituteSupply([{ free: 5, unitsPerDemandUnit: 1, scope: 'own_demand_only' }])).toBe(0);
    expect(() => substituteSupply([{ free: 1, unitsPerDemandUnit: 0, scope: 'full' }])).toThrow(RangeError);
  });

  it('never counts more than the stock could fill', () => {
    const stock = fc.record({
      free: fc.integer({ min: 0, max: 10_000 }),
      unitsPerDemandUnit: fc.double({ min: 0.01, max: 100, noNaN: true }),
      scope: fc.constantFrom('full' as const, 'own_demand_only' as const),
      ownDemand: fc.double({ min: 0, max: 10_000, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(stock, { maxLength: 10 }), (stocks) => {
        const total = substituteSupply(stocks);
        const ceiling = stocks.reduce((s, x) => s + x.free / x.unitsPerDemandUnit, 0);
        expect(total).toBeLessThanOrEqual(ceiling * (1 + 1e-12));
        expect(total).toBeGreaterThanOrEqual(0);
      }),
    );
  });
});
