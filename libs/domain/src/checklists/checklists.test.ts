import { describe, expect, it } from 'vitest';
import {
  compressionForDisplay,
  compressionSpread,
  compressionToStorage,
  handOverBlockers,
  isAtLeastAsSevere,
  rangePosition,
  readTyreDate,
  suggestForCompression,
  suggestForMeasurement,
  suggestForTyres,
  worseResult,
} from './checklists';
import { builtInTemplates, recommissioningTemplate } from './templates';

const day = (iso: string) => new Date(`${iso}T12:00:00Z`);

describe('measurement ranges', () => {
  it('treats the bounds as inside the range', () => {
    expect(rangePosition(10, { min: 10, max: 20 })).toBe('within');
    expect(rangePosition(20, { min: 10, max: 20 })).toBe('within');
    expect(rangePosition(9.99, { min: 10, max: 20 })).toBe('below');
    expect(rangePosition(20.01, { min: 10, max: 20 })).toBe('above');
  });
  it('works with one bound and with none', () => {
    expect(rangePosition(5, { min: 10 })).toBe('below');
    expect(rangePosition(500, { min: 10 })).toBe('within');
    expect(rangePosition(5, {})).toBe('no_range');
  });
  it('refuses an upside-down range and a non-number', () => {
    expect(() => rangePosition(5, { min: 20, max: 10 })).toThrow(RangeError);
    expect(() => rangePosition(Number.NaN, { min: 1 })).toThrow(RangeError);
  });
  it('suggests ok inside, advise or fail outside, nothing without a range', () => {
    expect(suggestForMeasurement(15, { min: 10, max: 20 }, false)).toBe('ok');
    expect(suggestForMeasurement(5, { min: 10, max: 20 }, false)).toBe('advise');
    expect(suggestForMeasurement(5, { min: 10, max: 20 }, true)).toBe('fail');
    expect(suggestForMeasurement(5, {}, true)).toBeNull();
  });
});

describe('result severity', () => {
  it('orders na < ok < advise < fail', () => {
    expect(worseResult('ok', 'advise')).toBe('advise');
    expect(worseResult('fail', 'advise')).toBe('fail');
    expect(worseResult('na', 'ok')).toBe('ok');
    expect(isAtLeastAsSevere('fail', 'advise')).toBe(true);
    expect(isAtLeastAsSevere('ok', 'fail')).toBe(false);
    expect(isAtLeastAsSevere('na', 'ok')).toBe(false);
  });
});

// Source: US 49 CFR 574.5 — the date code is the last four digits (week, then year) since 2000;
// before 2000 it had three digits. Limits 6 / 10 years are common practice, not a regulation.
describe('tyre age from the DOT code (49 CFR 574.5; limits common practice)', () => {
  it('reads week and year across a year boundary', () => {
    // Week 52 of 2019 vs week 01 of 2020: a few days apart, both about 6 years old in late 2025/2026.
    const late2019 = readTyreDate('DOT XY12 ABC 5219', day('2026-01-15'));
    const early2020 = readTyreDate('0120', day('2026-01-15'));
    expect(late2019.verdict).toBe('advise');
    expect(early2020.verdict).toBe('advise');
    expect(late2019.ageYears!).toBeGreaterThan(early2020.ageYears!);
    expect(early2020.ageYears!).toBeGreaterThan(5.9);
  });
  it('advises from 6 years and fails from 10 (common practice)', () => {
    // Week 01 of 2016 starts on Sunday 3 January 2016 (first full Sunday–Saturday week, our reading of 574.5, from memory).
    expect(readTyreDate('0116', day('2026-01-02')).verdict).toBe('advise');
    expect(readTyreDate('0116', day('2026-01-03')).verdict).toBe('fail');
    expect(readTyreDate('0120', day('2025-12-31')).verdict).toBe('ok');
    expect(readTyreDate('2324', day('2026-01-15')).verdict).toBe('ok');
  });
  it('fails a three-digit (pre-2000) code whatever its digits', () => {
    const old = readTyreDate('DOT AB CD 239', day('2026-01-15'));
    expect(old.verdict).toBe('fail');
    expect(old.pre2000).toBe(true);
  });
  it('calls a short or future code unreadable, and suggests nothing while one is', () => {
    expect(readTyreDate('12', day('2026-01-15')).verdict).toBe('unreadable');
    expect(readTyreDate('0199', day('2026-01-15')).verdict).toBe('unreadable'); // week 1 of 2099
    expect(suggestForTyres([readTyreDate('2324', day('2026-01-15')), readTyreDate('12', day('2026-01-15'))])).toBeNull();
  });
  it('lets the worst tyre decide', () => {
    const today = day('2026-01-15');
    expect(suggestForTyres([readTyreDate('2324', today), readTyreDate('239', today)])).toBe('fail');
    expect(suggestForTyres([readTyreDate('2324', today), readTyreDate('0119', today)])).toBe('advise');
    expect(suggestForTyres([])).toBeNull();
  });
});

// Source: NIST SP 811 (2008) appendix B.8: 1 psi = 6.894 757 E+00 kPa; 1 bar = 1.0 E+05 Pa exactly.
describe('compression units (NIST SP 811 appendix B)', () => {
  it('stores readings in kPa and shows them in psi or bar', () => {
    expect(compressionToStorage(100, 'psi')).toBeCloseTo(689.4757, 4);
    expect(compressionToStorage(10, 'bar')).toBe(1000);
    expect(compressionForDisplay(689.4757293168361, 'psi')).toBeCloseTo(100, 10);
    expect(compressionForDisplay(1000, 'bar')).toBe(10);
    expect(compressionForDisplay(1000, 'kPa')).toBe(1000);
  });
});

// Common practice (no published source): cylinders within about 10 % of the highest.
describe('compression spread (common practice: within 10 %)', () => {
  it('measures the spread from the highest cylinder', () => {
    expect(compressionSpread([900, 810])).toEqual({ lowest: 810, highest: 900, spreadPercent: 10 });
    expect(compressionSpread([1000, 1000, 1000, 1000]).spreadPercent).toBe(0);
  });
  it('refuses an empty or negative set', () => {
    expect(() => compressionSpread([])).toThrow(RangeError);
    expect(() => compressionSpread([800, -1])).toThrow(RangeError);
  });
  it('advises above 10 % spread, and the range decides a low cylinder', () => {
    expect(suggestForCompression([900, 810], { min: 690 }, false)).toBe('ok'); // exactly 10 %
    expect(suggestForCompression([900, 800], { min: 690 }, false)).toBe('advise'); // 11.1 %
    expect(suggestForCompression([900, 600], { min: 690 }, true)).toBe('fail');
    expect(suggestForCompression([900], {}, false)).toBe('ok');
    expect(suggestForCompression([], {}, false)).toBeNull();
  });
});

describe('hand-over blockers', () => {
  const base = { label: 'x', signedOff: false };
  it('blocks on a safety item failed or not recorded, not on advise, n/a or non-safety', () => {
    const blockers = handOverBlockers([
      { ...base, key: 'brakes', safety: true, result: 'fail' },
      { ...base, key: 'tyres', safety: true, result: null },
      { ...base, key: 'lights', safety: true, result: 'advise' },
      { ...base, key: 'sync', safety: true, result: 'na' },
      { ...base, key: 'paint', safety: false, result: 'fail' },
    ]);
    expect(blockers.map((b) => [b.key, b.reason])).toEqual([
      ['brakes', 'failed'],
      ['tyres', 'unrecorded'],
    ]);
  });
  it('lets the owner’s sign-off clear an item', () => {
    expect(handOverBlockers([{ ...base, key: 'brakes', safety: true, result: 'fail', signedOff: true }])).toEqual([]);
  });
});

describe('shipped templates', () => {
  it('have unique, well-formed keys and mark brakes, tyres, fuel and lights safety-critical', () => {
    for (const t of builtInTemplates) {
      const keys = t.items.map((i) => i.key);
      expect(new Set(keys).size).toBe(keys.length);
      for (const k of keys) expect(k).toMatch(/^[a-z0-9-]+$/);
    }
    const safety = recommissioningTemplate.items.filter((i) => i.safety).map((i) => i.key);
    expect(safety).toEqual(expect.arrayContaining(['fuel-taps-lines', 'brake-hydraulics', 'tyre-age', 'lights', 'steering']));
  });
  it('cover what recommissioning after storage asks for', () => {
    const keys = recommissioningTemplate.items.map((i) => i.key);
    expect(keys).toEqual(expect.arrayContaining(['fuel-tank', 'hoses', 'manifold-rubbers', 'brake-fluid', 'tyre-age', 'ignition', 'compression', 'throttle-sync', 'lights', 'road-test']));
  });
});
