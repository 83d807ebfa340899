import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { consignmentCommission, consignmentSettlement, milliPercentOf } from './consignment';

describe('consignmentSettlement', () => {
  it('matches a settlement worked by hand', () => {
    // Worked by hand (pen and paper), GBP, amounts in pence:
    //   sale price                           £12,345.00 = 1 234 500
    //   commission 12.5 %: 1 234 500 × 0.125 = 154 312.5 pence, an exact tie;
    //     a settlement is a document the consignor reads: half away from zero (decision 015) → 154 313 (£1,543.13)
    //   approved work: job 1  £480.00 =  48 000
    //                  job 2  £234.56 =  23 456          total   →    71 456 (£714.56)
    //   payout: 1 234 500 − 154 313 = 1 080 187; 1 080 187 − 71 456 = 1 008 731 (£10,087.31)
    const s = consignmentSettlement({
      salePriceMinor: 1_234_500,
      commission: { kind: 'percent', milliPercent: 12_500 },
      work: [
        { label: 'Job 1', amountMinor: 48_000 },
        { label: 'Job 2', amountMinor: 23_456 },
      ],
    });
    expect(s).toEqual({ salePriceMinor: 1_234_500, commissionMinor: 154_313, workMinor: 71_456, payoutMinor: 1_008_731, consignorOwesMinor: 0 });
  });

  it('takes a fixed commission as agreed, whatever the sale price', () => {
    // £8,000.00 sale, £750.00 fixed fee, no work: 800 000 − 75 000 = 725 000.
    expect(consignmentSettlement({ salePriceMinor: 800_000, commission: { kind: 'fixed', amountMinor: 75_000 }, work: [] }).payoutMinor).toBe(725_000);
  });

  it('shows what the consignor owes when deductions exceed the sale', () => {
    // 100 000 − 10 % (10 000) − 95 000 = −5 000: the consignor owes £50.00.
    const s = consignmentSettlement({ salePriceMinor: 100_000, commission: { kind: 'percent', milliPercent: 10_000 }, work: [{ label: 'Engine', amountMinor: 95_000 }] });
    expect(s.payoutMinor).toBe(-5_000);
    expect(s.consignorOwesMinor).toBe(5_000);
  });

  it('refuses negative or fractional amounts and percentages over 100', () => {
    expect(() => consignmentSettlement({ salePriceMinor: -1, commission: { kind: 'fixed', amountMinor: 0 }, work: [] })).toThrow(RangeError);
    expect(() => consignmentSettlement({ salePriceMinor: 100, commission: { kind: 'fixed', amountMinor: 1.5 }, work: [] })).toThrow(RangeError);
    expect(() => consignmentSettlement({ salePriceMinor: 100, commission: { kind: 'percent', milliPercent: 100_001 }, work: [] })).toThrow(RangeError);
    expect(() => consignmentSettlement({ salePriceMinor: 100, commission: { kind: 'fixed', amountMinor: 0 }, work: [{ label: 'x', amountMinor: -5 }] })).toThrow(RangeError);
  });
});

describe('consignmentCommission', () => {
  it('rounds exact ties to even and others to nearest', () => {
    expect(consignmentCommission(1_234_500, { kind: 'percent', milliPercent: 12_500 })).toBe(154_313); // 154 312.5 → away from zero
    expect(consignmentCommission(1_234_700, { kind: 'percent', milliPercent: 12_500 })).toBe(154_338); // 154 337.5 → away from zero
    expect(consignmentCommission(999, { kind: 'percent', milliPercent: 15_000 })).toBe(150); // 149.85 → 150
    expect(consignmentCommission(500_000, { kind: 'percent', milliPercent: 0 })).toBe(0);
    expect(consignmentCommission(500_000, { kind: 'percent', milliPercent: 100_000 })).toBe(500_000);
  });

  it('agrees with decimal.js ROUND_HALF_UP (ties away from zero) for any sale and percentage', () => {
    // Independent library: decimal.js, sale × percent / 100 rounded with ROUND_HALF_UP (ties away from zero).
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000_000 }), fc.integer({ min: 0, max: 100_000 }), (sale, milli) => {
        const expected = new Decimal(sale).mul(milli).div(100_000).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
        expect(consignmentCommission(sale, { kind: 'percent', milliPercent: milli })).toBe(expected);
      }),
    );
  });
});

describe('milliPercentOf', () => {
  it('reads percentages with up to three places', () => {
    expect(milliPercentOf('12.5')).toBe(12_500);
    expect(milliPercentOf('7')).toBe(7_000);
    expect(milliPercentOf('0.125')).toBe(125);
    expect(milliPercentOf('100')).toBe(100_000);
    expect(milliPercentOf('100.001')).toBeNull();
    expect(milliPercentOf('1.2345')).toBeNull();
    expect(milliPercentOf('-1')).toBeNull();
    expect(milliPercentOf('abc')).toBeNull();
  });
});
