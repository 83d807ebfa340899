/**
 * Tyre date codes: the end of the tyre identification number (TIN) moulded on the sidewall, per
 * US 49 CFR 574.5. Since 2000 the last four digits are the week (01–53) and the year ("2319" is
 * week 23 of 2019); before 2000 the code had three digits (week and the last digit of the year),
 * which cannot tell one decade from another.
 */

/** A read date code. `pre2000` keeps what the three digits say, though the decade is unknown. */
export type DotDateCode =
  | { kind: 'dated'; week: number; year: number }
  | { kind: 'pre2000'; week: number; yearDigit: number }
  | { kind: 'invalid'; reason: 'empty' | 'not_digits' | 'length' | 'week' };

/** The age verdict for a tyre. */
export type TyreAgeVerdict = 'ok' | 'advise' | 'fail';

/**
 * Common practice, no published source: many tyre makers and trade bodies advise inspection from
 * about six years after manufacture and replacement at ten whatever the tread looks like.
 */
export const TYRE_ADVISE_FROM_YEARS = 6;
/** Common practice (see TYRE_ADVISE_FROM_YEARS). */
export const TYRE_FAIL_FROM_YEARS = 10;

const DAY_MS = 86_400_000;

/**
 * Reads the date code from a full TIN ("DOT ABC DEFG 2319") or the code alone ("2319"). The
 * trailing run of digits decides: four or more → the last four are week and year; exactly three →
 * pre-2000; fewer → invalid. Trailing marks that are not letters or digits (the triangle some
 * 1990s tyres carry) are ignored. Weeks 00 and 54–99 are invalid; week 53 is accepted for any year.
 */
export function parseDotDateCode(tin: string): DotDateCode {
  const text = tin.replace(/[^A-Za-z0-9]+$/, '');
  if (text.trim() === '') return { kind: 'invalid', reason: 'empty' };
  const digits = /(\d+)$/.exec(text)?.[1];
  if (digits === undefined) return { kind: 'invalid', reason: 'not_digits' };
  if (digits.length < 3) return { kind: 'invalid', reason: 'length' };
  if (digits.length === 3) {
    const week = Number(digits.slice(0, 2));
    if (week < 1 || week > 53) return { kind: 'invalid', reason: 'week' };
    return { kind: 'pre2000', week, yearDigit: Number(digits.slice(2)) };
  }
  const code = digits.slice(-4);
  const week = Number(code.slice(0, 2));
  if (week < 1 || week > 53) return { kind: 'invalid', reason: 'week' };
  return { kind: 'dated', week, year: 2000 + Number(code.slice(2)) };
}

/**
 * The first day (UTC) of a date-code week. Week 01 is taken as the first full Sunday-to-Saturday
 * week of the year (our reading of 49 CFR 574.5(b)(3), from memory). Using the week's first day
 * makes the age a day or six too old rather than too young, which is the safe side for a tyre.
 */
export function dotWeekStart(year: number, week: number): Date {
  const januaryFirst = Date.UTC(year, 0, 1);
  const weekday = new Date(januaryFirst).getUTCDay(); // 0 = Sunday
  const firstSunday = januaryFirst + ((7 - weekday) % 7) * DAY_MS;
  return new Date(firstSunday + (week - 1) * 7 * DAY_MS);
}

function utcDay(date: Date): number {
  return Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate());
}

function addYears(day: number, years: number): number {
  const date = new Date(day);
  return Date.UTC(date.getUTCFullYear() + years, date.getUTCMonth(), date.getUTCDate());
}

/** Calendar years from `from` to `to` (UTC days): whole anniversaries plus the fraction of the next year. */
function yearsBetween(from: number, to: number): number {
  let years = new Date(to).getUTCFullYear() - new Date(from).getUTCFullYear();
  if (addYears(from, years) > to) years -= 1;
  const anniversary = addYears(from, years);
  const next = addYears(from, years + 1);
  return years + (to - anniversary) / (next - anniversary);
}

/**
 * The age in years of a tyre on `today` (compared as UTC calendar days), counted from the first day
 * of its date-code week. For a pre-2000 code it is the smallest age the tyre can have (counted from
 * 1 January 2000). Null for an unreadable code or a date after `today` (a misread code).
 */
export function tyreAgeYears(code: string | DotDateCode, today: Date): number | null {
  const parsed = typeof code === 'string' ? parseDotDateCode(code) : code;
  if (parsed.kind === 'invalid') return null;
  const made = parsed.kind === 'dated' ? dotWeekStart(parsed.year, parsed.week).getTime() : Date.UTC(2000, 0, 1);
  const now = utcDay(today);
  if (made > now) return null;
  return yearsBetween(made, now);
}

/**
 * The verdict for an age: 'advise' (inspect, tell the customer) from 6 years, 'fail' (replace)
 * from 10. The limits are common practice, not a regulation.
 */
export function tyreAgeVerdict(ageYears: number): TyreAgeVerdict {
  if (!Number.isFinite(ageYears) || ageYears < 0) throw new RangeError(`Not an age: ${ageYears}`);
  if (ageYears >= TYRE_FAIL_FROM_YEARS) return 'fail';
  if (ageYears >= TYRE_ADVISE_FROM_YEARS) return 'advise';
  return 'ok';
}

/**
 * Reads a code and gives the verdict in one step: a pre-2000 code is always 'fail' (at least 26
 * years old by now), an unreadable or future code is 'unreadable' so the mechanic looks again.
 */
export function tyreVerdictForCode(code: string, today: Date): TyreAgeVerdict | 'unreadable' {
  const parsed = parseDotDateCode(code);
  if (parsed.kind === 'pre2000') return 'fail';
  const age = tyreAgeYears(parsed, today);
  return age === null ? 'unreadable' : tyreAgeVerdict(age);
}
