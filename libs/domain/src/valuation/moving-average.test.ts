import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { closingPosition, ValuationError, valueMovements, type StockMovement } from './moving-average';

/** The error a fold throws, or null. */
function refusal(run: () => unknown): ValuationError | null {
  try {
    run();
    return null;
  } catch (error) {
    if (error instanceof ValuationError) return error;
    throw error;
  }
}

describe('published worked examples of the moving-average (perpetual weighted average) method', () => {
  it('Weygandt, Kimmel & Kieso, Accounting Principles, ch. 6 appendix 6A: the moving-average illustration', () => {
    // Source: Weygandt, Kimmel & Kieso, *Accounting Principles*, ch. 6, appendix 6A (perpetual
    // inventory, moving-average method). Figures from memory, re-check against the edition in hand:
    // 100 @ $10, 200 @ $11, 300 @ $12, sale of 550, 400 @ $13; the book shows averages $10.667 and
    // $11.333, cost of goods sold $6,233, ending inventory $5,767 and a final average of $12.816.
    // Amounts here are in cents.
    const steps = valueMovements([
      { kind: 'receipt', quantity: 100, unitCost: 1000 },
      { kind: 'receipt', quantity: 200, unitCost: 1100 },
      { kind: 'receipt', quantity: 300, unitCost: 1200 },
      { kind: 'issue', quantity: 550 },
      { kind: 'receipt', quantity: 400, unitCost: 1300 },
    ]);
    expect(steps.map((s) => [s.quantity, s.value])).toEqual([
      [100, 100_000],
      [300, 320_000],
      [600, 680_000],
      [50, 56_667],
      [450, 576_667],
    ]);
    expect(steps[1]!.unitCost).toBe(1066.6667); // book: $10.667
    expect(steps[2]!.unitCost).toBe(1133.3333); // book: $11.333
    expect(steps[3]!.valueChange).toBe(-623_333); // 550 × 6,800/600 = 6,233.33…; book: $6,233 (whole dollars)
    expect(Math.round(steps[4]!.value / 100)).toBe(5767); // $5,766.67; book: $5,767 (whole dollars)
    // The book divides its rounded $5,767 by 450 (12.8156 → $12.816); the exact average is 12.8148.
    expect(Math.abs(steps[4]!.unitCost! / 100 - 12.816)).toBeLessThan(0.002);
  });

  it('a web lesson that rounds the average to cents first differs by exactly that rounding', () => {
    // Source: InstantCert Academy, accounting course, lesson "average cost method ... perpetual
    // system" (https://www.instantcertcredit.com/courses/5/lesson/318): 500 units for $1,200; sale of
    // 300 costs $720; 100 @ $3.50 gives $830 for 300 units, average "$2.77"; sale of 250 costs
    // $692.50 (at the rounded $2.77); 50 left at $138.50; 300 @ $4.00; ending $1,338.50.
    const steps = valueMovements(
      [
        { kind: 'issue', quantity: 300 },
        { kind: 'receipt', quantity: 100, unitCost: 350 },
        { kind: 'issue', quantity: 250 },
        { kind: 'receipt', quantity: 300, unitCost: 400 },
      ],
      { quantity: 500, value: 120_000 },
    );
    expect(steps[0]!.valueChange).toBe(-72_000); // $720, as the lesson
    expect(steps[1]!.value).toBe(83_000); // $830, as the lesson
    // Our policy keeps the exact average 2.7666…: the sale costs $691.67, not $692.50 …
    expect(steps[2]!.valueChange).toBe(-69_167);
    // … and the lesson's figure is what the rounded average gives: 250 × 277 cents.
    expect(250 * 277).toBe(69_250);
    expect(steps[3]!.value).toBe(133_833); // $1,338.33 against the lesson's $1,338.50
  });
});

describe('valueMovements: the rounding policy', () => {
  it('takes the whole value with the last unit, rounding each issue once, ties to even', () => {
    // 3 units for 10.00: issues cost 333.33 → 333, then 667/2 = 333.5 → 334 (the even neighbour), then 333.
    const steps = valueMovements([
      { kind: 'receipt', quantity: 3, totalCost: 1000 },
      { kind: 'issue', quantity: 1 },
      { kind: 'issue', quantity: 1 },
      { kind: 'issue', quantity: 1 },
    ]);
    expect(steps.map((s) => s.valueChange)).toEqual([1000, -333, -334, -333]);
    expect(steps[3]).toMatchObject({ quantity: 0, value: 0, unitCost: null });
  });

  it('rounds a receipt with fractions of a minor unit half to even', () => {
    const steps = valueMovements([
      { kind: 'receipt', quantity: '2.5', unitCost: '1234.5' }, // 3086.25 → 3086
      { kind: 'receipt', quantity: 1, unitCost: '0.5' }, // 0.5 → 0 (even)
      { kind: 'receipt', quantity: 3, unitCost: '0.5' }, // 1.5 → 2 (even)
    ]);
    expect(steps.map((s) => s.valueChange)).toEqual([3086, 0, 2]);
    expect(steps[2]!.quantity).toBe(6.5);
  });

  it('handles fractional quantities exactly (0.1 + 0.2 litres is 0.3)', () => {
    const { quantity, value } = closingPosition([
      { kind: 'receipt', quantity: 0.1, unitCost: 1000 },
      { kind: 'receipt', quantity: 0.2, unitCost: 1000 },
      { kind: 'issue', quantity: 0.3 },
    ]);
    expect(quantity).toBe(0);
    expect(value).toBe(0);
  });

  it('brings returns back at the given cost or at the average', () => {
    const steps = valueMovements([
      { kind: 'receipt', quantity: 10, unitCost: 500 },
      { kind: 'issue', quantity: 4 },
      { kind: 'return', quantity: 1 }, // at the average: the average stays 500
      { kind: 'receipt', quantity: 7, unitCost: 800 }, // average moves: (3500 + 5600) / 14 = 650
      { kind: 'return', quantity: 2, unitCost: 500 }, // at the cost it was issued at
    ]);
    expect(steps[2]).toMatchObject({ quantity: 7, value: 3500, unitCost: 500 });
    expect(steps[3]).toMatchObject({ quantity: 14, value: 9100, unitCost: 650 });
    expect(steps[4]).toMatchObject({ quantity: 16, value: 10_100, unitCost: 631.25 });
  });

  it('turns counts and adjustments into movements at the average, or at a given cost', () => {
    const steps = valueMovements([
      { kind: 'receipt', quantity: 8, unitCost: 250 },
      { kind: 'count', countedQuantity: 6 }, // two missing: out at 250
      { kind: 'count', countedQuantity: 6 }, // no difference, no change
      { kind: 'adjustment', quantityDelta: 2, unitCost: 400 }, // found, valued at 400
      { kind: 'adjustment', quantityDelta: -1 }, // damaged: out at the average 287.5
      { kind: 'count', countedQuantity: 0 },
    ]);
    expect(steps.map((s) => [s.quantity, s.value, s.valueChange])).toEqual([
      [8, 2000, 2000],
      [6, 1500, -500],
      [6, 1500, 0],
      [8, 2300, 800],
      [7, 2012, -288], // 287.5 → 288 (the even neighbour)
      [0, 0, -2012],
    ]);
  });

  it('continues from an opening position', () => {
    const fromScratch = closingPosition([
      { kind: 'receipt', quantity: 5, unitCost: 120 },
      { kind: 'issue', quantity: 2 },
      { kind: 'receipt', quantity: 4, unitCost: 150 },
    ]);
    const continued = closingPosition([{ kind: 'receipt', quantity: 4, unitCost: 150 }], { quantity: 3, value: 360 });
    expect(continued).toEqual(fromScratch);
    expect(closingPosition([], { quantity: 3, value: 360 })).toEqual({ quantity: 3, value: 360, unitCost: 120 });
  });
});

describe('valueMovements: refusals', () => {
  it('refuses to issue more than is on hand, naming the step', () => {
    const error = refusal(() =>
      valueMovements([
        { kind: 'receipt', quantity: 2, unitCost: 100 },
        { kind: 'issue', quantity: 3 },
      ]),
    );
    expect(error?.code).toBe('insufficient_stock');
    expect(error?.step).toBe(1);
    expect(refusal(() => valueMovements([{ kind: 'adjustment', quantityDelta: -1 }]))?.code).toBe('insufficient_stock');
  });

  it('refuses stock coming in at the average when there is no average', () => {
    expect(refusal(() => valueMovements([{ kind: 'return', quantity: 1 }]))?.code).toBe('no_cost_basis');
    expect(refusal(() => valueMovements([{ kind: 'count', countedQuantity: 4 }]))?.code).toBe('no_cost_basis');
    expect(valueMovements([{ kind: 'count', countedQuantity: 4, unitCost: 90 }])[0]).toMatchObject({ quantity: 4, value: 360 });
  });

  it('refuses malformed movements', () => {
    const invalid: StockMovement[] = [
      { kind: 'receipt', quantity: 0, unitCost: 100 },
      { kind: 'receipt', quantity: -1, unitCost: 100 },
      { kind: 'receipt', quantity: '0.00001', unitCost: 100 },
      { kind: 'receipt', quantity: 'ten', unitCost: 100 },
      { kind: 'receipt', quantity: 1, unitCost: -5 },
      { kind: 'receipt', quantity: 1, unitCost: 'abc' },
      { kind: 'receipt', quantity: 1, totalCost: 1.5 },
      { kind: 'issue', quantity: 0 },
      { kind: 'count', countedQuantity: -1 },
    ];
    for (const movement of invalid) expect(refusal(() => valueMovements([movement]))?.code).toBe('invalid_movement');
    expect(refusal(() => valueMovements([], { quantity: 0, value: 5 }))?.code).toBe('invalid_movement');
  });
});

/** Exact rational arithmetic for an unrounded reference implementation of the moving average. */
type Fraction = { n: bigint; d: bigint };
const gcd = (a: bigint, b: bigint): bigint => (b === 0n ? (a < 0n ? -a : a) : gcd(b, a % b));
const frac = (n: bigint, d = 1n): Fraction => {
  const g = gcd(n, d) || 1n;
  return { n: n / g, d: d / g };
};
const add = (a: Fraction, b: Fraction) => frac(a.n * b.d + b.n * a.d, a.d * b.d);
const times = (a: Fraction, b: Fraction) => frac(a.n * b.n, a.d * b.d);
const over = (a: Fraction, b: Fraction) => frac(a.n * b.d, a.d * b.n);

describe('valueMovements: properties', () => {
  const quantity = fc.integer({ min: 1, max: 50_000 }).map((tenths) => tenths / 10); // up to 5,000.0
  const unitCost = fc.oneof(fc.integer({ min: 0, max: 100_000 }), fc.integer({ min: 0, max: 10_000_000 }).map((c) => (c / 10_000).toFixed(4)));
  const movement: fc.Arbitrary<StockMovement> = fc.oneof(
    fc.record({ kind: fc.constant('receipt' as const), quantity, unitCost }),
    fc.record({ kind: fc.constant('issue' as const), quantity }),
    fc.record({ kind: fc.constant('return' as const), quantity }),
    fc.record({ kind: fc.constant('return' as const), quantity, unitCost }),
    fc.record({ kind: fc.constant('adjustment' as const), quantityDelta: fc.integer({ min: -5000, max: 5000 }).map((d) => d / 10) }),
    fc.record({ kind: fc.constant('count' as const), countedQuantity: fc.integer({ min: 0, max: 50_000 }).map((c) => c / 10), unitCost }),
  );

  /** Keeps the movements the fold accepts, checking that each refusal was deserved. */
  function acceptedOnly(movements: StockMovement[]): StockMovement[] {
    const accepted: StockMovement[] = [];
    for (const candidate of movements) {
      const before = closingPosition(accepted);
      const error = refusal(() => valueMovements([...accepted, candidate]));
      if (error === null) {
        accepted.push(candidate);
        continue;
      }
      expect(error.step).toBe(accepted.length);
      if (error.code === 'insufficient_stock') {
        const out = candidate.kind === 'issue' ? Number(candidate.quantity) : candidate.kind === 'adjustment' ? -Number(candidate.quantityDelta) : Number.NaN;
        expect(out).toBeGreaterThan(before.quantity);
      } else {
        expect(error.code).toBe('no_cost_basis');
        expect(before.quantity).toBe(0);
      }
    }
    return accepted;
  }

  it('never lets quantity or value go negative, and value equals quantity × unit cost within the policy', () => {
    fc.assert(
      fc.property(fc.array(movement, { maxLength: 25 }), (movements) => {
        const steps = valueMovements(acceptedOnly(movements));
        for (const step of steps) {
          expect(step.quantity).toBeGreaterThanOrEqual(0);
          expect(step.value).toBeGreaterThanOrEqual(0);
          expect(Number.isSafeInteger(step.value)).toBe(true);
          if (step.quantity === 0) {
            expect(step.value).toBe(0);
            expect(step.unitCost).toBeNull();
          } else {
            // The reported unit cost is rounded to 4 decimals: off by at most 0.00005 per unit.
            expect(Math.abs(step.quantity * step.unitCost! - step.value)).toBeLessThanOrEqual(step.quantity * 0.00005 + 1e-6);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  it('conserves value: the movements add up to the closing value, to the minor unit', () => {
    fc.assert(
      fc.property(fc.array(movement, { maxLength: 25 }), (movements) => {
        const steps = valueMovements(acceptedOnly(movements));
        const total = steps.reduce((sum, step) => sum + step.valueChange, 0);
        expect(total).toBe(steps.at(-1)?.value ?? 0);
      }),
      { numRuns: 300 },
    );
  });

  // Movements whose inflows all carry a cost. Stock brought in at the average multiplies whatever
  // rounding is already in the value by (Q + q) / Q, as any average-based method must, so the
  // half-a-minor-unit-per-step bound below is stated for these.
  const costedMovement: fc.Arbitrary<StockMovement> = fc.oneof(
    fc.record({ kind: fc.constant('receipt' as const), quantity, unitCost }),
    fc.record({ kind: fc.constant('issue' as const), quantity }),
    fc.record({ kind: fc.constant('return' as const), quantity, unitCost }),
    fc.record({ kind: fc.constant('adjustment' as const), quantityDelta: fc.integer({ min: -5000, max: -1 }).map((d) => d / 10) }),
    fc.record({ kind: fc.constant('count' as const), countedQuantity: fc.integer({ min: 0, max: 50_000 }).map((c) => c / 10), unitCost }),
  );

  it('stays within half a minor unit per rounded movement of the exact, unrounded moving average', () => {
    // Independent reference: the same method in exact fractions, never rounded.
    fc.assert(
      fc.property(fc.array(costedMovement, { maxLength: 25 }), (movements) => {
        const accepted = acceptedOnly(movements);
        let q = frac(0n);
        let v = frac(0n);
        const dec = (x: number | string) => {
          const [whole = '', fraction = ''] = String(x).split('.');
          return frac(BigInt(whole + fraction), 10n ** BigInt(fraction.length));
        };
        for (const m of accepted) {
          let delta: Fraction;
          let cost: number | string | undefined;
          if (m.kind === 'receipt') [delta, cost] = [dec(m.quantity), 'unitCost' in m ? m.unitCost : undefined];
          else if (m.kind === 'issue') [delta, cost] = [times(dec(m.quantity), frac(-1n)), undefined];
          else if (m.kind === 'return') [delta, cost] = [dec(m.quantity), m.unitCost];
          else if (m.kind === 'adjustment') [delta, cost] = [dec(m.quantityDelta), m.unitCost];
          else [delta, cost] = [add(dec(m.countedQuantity), times(q, frac(-1n))), m.unitCost];
          if (delta.n === 0n) continue;
          const atAverage = delta.n < 0n || cost === undefined;
          v = add(v, atAverage ? times(over(v, q), delta) : times(delta, dec(cost!)));
          q = add(q, delta);
        }
        const ours = closingPosition(accepted).value;
        const exact = Number(v.n) / Number(v.d);
        expect(Math.abs(ours - exact)).toBeLessThanOrEqual(0.5 * accepted.length + 1e-6);
      }),
      { numRuns: 200 },
    );
  });
});
