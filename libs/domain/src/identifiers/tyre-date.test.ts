import { describe, expect, it } from 'vitest';
import { dotWeekStart, parseDotDateCode, tyreAgeVerdict, tyreAgeYears, tyreVerdictForCode } from './tyre-date';

const day = (iso: string) => new Date(`${iso}T00:00:00Z`);
const isoDay = (date: Date) => date.toISOString().slice(0, 10);

describe('parseDotDateCode', () => {
  it('reads the last four digits as week and year', () => {
    // Source: US 49 CFR 574.5 — the last four symbols of the TIN are week and year; "2319" = week 23 of 2019.
    expect(parseDotDateCode('2319')).toEqual({ kind: 'dated', week: 23, year: 2019 });
    // An invented full TIN: plant, size and option codes before the date code.
    expect(parseDotDateCode('DOT XY7 AB CDEF 2319')).toEqual({ kind: 'dated', week: 23, year: 2019 });
    expect(parseDotDateCode('XY7ABCDEF0104')).toEqual({ kind: 'dated', week: 1, year: 2004 });
    expect(parseDotDateCode('DOT XY7 AB CDE7 2319 ')).toEqual({ kind: 'dated', week: 23, year: 2019 });
  });

  it('accepts weeks 01 to 53 and refuses 00 and 54', () => {
    expect(parseDotDateCode('0120')).toEqual({ kind: 'dated', week: 1, year: 2020 });
    expect(parseDotDateCode('5317')).toEqual({ kind: 'dated', week: 53, year: 2017 });
    expect(parseDotDateCode('0019')).toEqual({ kind: 'invalid', reason: 'week' });
    expect(parseDotDateCode('5419')).toEqual({ kind: 'invalid', reason: 'week' });
    expect(parseDotDateCode('9919')).toEqual({ kind: 'invalid', reason: 'week' });
  });

  it('takes a three-digit code as made before 2000', () => {
    // Source: 49 CFR 574.5 before the 1999 amendment (Federal Register 64 FR 36807, 8 July 1999):
    // the date was the last three symbols, week and the last digit of the year.
    expect(parseDotDateCode('519')).toEqual({ kind: 'pre2000', week: 51, yearDigit: 9 });
    expect(parseDotDateCode('DOT XY AB CDE 519◄')).toEqual({ kind: 'pre2000', week: 51, yearDigit: 9 });
    expect(parseDotDateCode('009')).toEqual({ kind: 'invalid', reason: 'week' });
  });

  it('says why a code cannot be read', () => {
    expect(parseDotDateCode('')).toEqual({ kind: 'invalid', reason: 'empty' });
    expect(parseDotDateCode('   ')).toEqual({ kind: 'invalid', reason: 'empty' });
    expect(parseDotDateCode('DOT XYZ')).toEqual({ kind: 'invalid', reason: 'not_digits' });
    expect(parseDotDateCode('DOT XY 19')).toEqual({ kind: 'invalid', reason: 'length' });
  });
});

describe('dotWeekStart', () => {
  it('starts week 01 on the first Sunday of the year', () => {
    // Reading of 49 CFR 574.5(b)(3) from memory, re-check: week 01 is the first full calendar week,
    // Sunday to Saturday. Calendar facts: 1 Jan 2019 was a Tuesday, 1 Jan 2020 a Wednesday,
    // 1 Jan 2017 a Sunday, 1 Jan 2023 a Sunday.
    expect(isoDay(dotWeekStart(2019, 1))).toBe('2019-01-06');
    expect(isoDay(dotWeekStart(2019, 52))).toBe('2019-12-29');
    expect(isoDay(dotWeekStart(2020, 1))).toBe('2020-01-05');
    expect(isoDay(dotWeekStart(2023, 1))).toBe('2023-01-01');
    expect(isoDay(dotWeekStart(2017, 53))).toBe('2017-12-31');
  });
});

describe('tyre age across year boundaries', () => {
  it('week 52 of 2019 is older than week 01 of 2020 by a week', () => {
    const today = day('2026-01-01');
    expect(tyreAgeYears('5219', today)).toBeGreaterThanOrEqual(6);
    expect(tyreAgeYears('0120', today)).toBeLessThan(6);
    expect(tyreVerdictForCode('5219', today)).toBe('advise');
    expect(tyreVerdictForCode('0120', today)).toBe('ok');
  });

  it('turns at the anniversary of the week start, not before', () => {
    expect(tyreAgeYears('5219', day('2025-12-29'))).toBe(6);
    expect(tyreVerdictForCode('5219', day('2025-12-28'))).toBe('ok');
    expect(tyreVerdictForCode('5219', day('2025-12-29'))).toBe('advise');
    // Week 53 of 2017 starts on 31 December 2017: ten years later it fails.
    expect(tyreVerdictForCode('5317', day('2027-12-30'))).toBe('advise');
    expect(tyreVerdictForCode('5317', day('2027-12-31'))).toBe('fail');
  });

  it('counts fractions of a year by the calendar', () => {
    // Week 01 of 2023 starts on 1 Jan 2023; 2 Jul 2023 is 182 days later, of the 365 to 1 Jan 2024.
    expect(tyreAgeYears('0123', day('2023-07-02'))).toBeCloseTo(182 / 365, 12);
    // The time of day of "today" does not matter, only its UTC calendar day.
    expect(tyreAgeYears('0123', new Date('2024-01-01T23:59:59Z'))).toBe(1);
  });

  it('gives no age for a code dated after today, which is a misreading', () => {
    expect(tyreAgeYears('0125', day('2024-06-01'))).toBeNull();
    expect(tyreVerdictForCode('0125', day('2024-06-01'))).toBe('unreadable');
    expect(tyreVerdictForCode('DOT XYZ', day('2024-06-01'))).toBe('unreadable');
  });

  it('fails a pre-2000 tyre whatever its digits say', () => {
    expect(tyreVerdictForCode('519', day('2026-01-01'))).toBe('fail');
    expect(tyreAgeYears('519', day('2026-01-01'))).toBe(26); // at least: counted from 1 Jan 2000
  });
});

describe('tyreAgeVerdict', () => {
  it('advises from 6 years and fails from 10 (common practice, no published source)', () => {
    expect(tyreAgeVerdict(0)).toBe('ok');
    expect(tyreAgeVerdict(5.99)).toBe('ok');
    expect(tyreAgeVerdict(6)).toBe('advise');
    expect(tyreAgeVerdict(9.99)).toBe('advise');
    expect(tyreAgeVerdict(10)).toBe('fail');
    expect(tyreAgeVerdict(40)).toBe('fail');
  });

  it('refuses what is not an age', () => {
    expect(() => tyreAgeVerdict(-1)).toThrow(RangeError);
    expect(() => tyreAgeVerdict(Number.NaN)).toThrow(RangeError);
  });
});
