import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SerialValuationError, valueSerialised, type SerialMovement } from './serialised';

describe('valueSerialised (specific identification, IAS 2 ¶23–24)', () => {
  it('issues each item at its own cost, never at an average', () => {
    // Principle: IAS 2 ¶23 — items not ordinarily interchangeable are costed by specific
    // identification of their individual costs. The numbers are invented.
    const position = valueSerialised([
      { kind: 'receipt', serial: 'ENG-1041', cost: 185_000 },
      { kind: 'receipt', serial: 'ENG-2207', cost: 92_500 },
      { kind: 'receipt', serial: 'FRM-0318', cost: 40_000 },
      { kind: 'issue', serial: 'ENG-1041' },
    ]);
    expect(position.issuedCost).toBe(185_000); // the average of the engines (138,750) would be wrong
    expect(position.value).toBe(132_500);
    expect(position.onHand).toEqual([
      { serial: 'ENG-2207', cost: 92_500 },
      { serial: 'FRM-0318', cost: 40_000 },
    ]);
  });

  it('lets an item come back at its new cost after it left', () => {
    const position = valueSerialised([
      { kind: 'receipt', serial: 'ENG-1041', cost: 185_000 },
      { kind: 'issue', serial: 'ENG-1041' },
      { kind: 'receipt', serial: 'ENG-1041', cost: 120_000 },
    ]);
    expect(position).toEqual({ onHand: [{ serial: 'ENG-1041', cost: 120_000 }], value: 120_000, issuedCost: 185_000 });
  });

  it('refuses a serial twice on hand, an unknown serial and a bad cost', () => {
    const codeOf = (movements: SerialMovement[]) => {
      try {
        valueSerialised(movements);
        return null;
      } catch (error) {
        return error instanceof SerialValuationError ? [error.code, error.step] : 'other';
      }
    };
    expect(codeOf([{ kind: 'receipt', serial: 'A', cost: 1 }, { kind: 'receipt', serial: 'A', cost: 2 }])).toEqual(['duplicate_serial', 1]);
    expect(codeOf([{ kind: 'issue', serial: 'B' }])).toEqual(['unknown_serial', 0]);
    expect(codeOf([{ kind: 'receipt', serial: 'C', cost: -1 }])).toEqual(['invalid_cost', 0]);
    expect(codeOf([{ kind: 'receipt', serial: 'C', cost: 0.5 }])).toEqual(['invalid_cost', 0]);
  });

  it('conserves cost: received = on hand + issued', () => {
    const item = fc.record({ serial: fc.string({ minLength: 1, maxLength: 6 }), cost: fc.integer({ min: 0, max: 10_000_000 }) });
    const items = fc.uniqueArray(item, { selector: (r) => r.serial, maxLength: 20 });
    fc.assert(
      fc.property(items, fc.array(fc.boolean(), { maxLength: 20 }), (received, issue) => {
        const movements: SerialMovement[] = [
          ...received.map((r) => ({ kind: 'receipt' as const, ...r })),
          ...received.filter((_, i) => issue[i]).map((r) => ({ kind: 'issue' as const, serial: r.serial })),
        ];
        const position = valueSerialised(movements);
        expect(position.value + position.issuedCost).toBe(received.reduce((sum, r) => sum + r.cost, 0));
      }),
    );
  });
});
