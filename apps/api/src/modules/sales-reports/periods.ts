import type { ReportPeriod, UnpaidAgeBucket } from '@tappet/contracts';

const DAY = 86_400_000;
const dayOf = (iso: string) => Date.parse(`${iso}T00:00:00Z`);
const isoOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** The first day of the period holding `day` (UTC): the day itself, its ISO week's Monday, or the 1st of its month. */
export function periodStart(day: string, period: ReportPeriod): string {
  if (period === 'day') return day;
  if (period === 'month') return `${day.slice(0, 7)}-01`;
  const ms = dayOf(day);
  const weekday = (new Date(ms).getUTCDay() + 6) % 7; // Monday 0 … Sunday 6 (ISO 8601)
  return isoOf(ms - weekday * DAY);
}

/** The first day of the period after the one starting on `start`. */
export function nextPeriodStart(start: string, period: ReportPeriod): string {
  if (period === 'day') return isoOf(dayOf(start) + DAY);
  if (period === 'week') return isoOf(dayOf(start) + 7 * DAY);
  const d = new Date(dayOf(start));
  return isoOf(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1));
}

/** Every period start from the period of `from` to the period of `to`, in order. */
export function periodStarts(from: string, to: string, period: ReportPeriod): string[] {
  const out: string[] = [];
  const last = periodStart(to, period);
  for (let s = periodStart(from, period); s <= last; s = nextPeriodStart(s, period)) out.push(s);
  return out;
}

/** Words for a period: "14 Mar 2026", "week of 9 Mar 2026", "Mar 2026". */
export function periodLabel(start: string, period: ReportPeriod): string {
  const d = new Date(dayOf(start));
  if (period === 'month') return d.toLocaleDateString('en-GB', { month: 'short', year: 'numeric', timeZone: 'UTC' });
  const text = d.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
  return period === 'week' ? `week of ${text}` : text;
}

/** The default window: eleven whole periods before today's, and today's (a year by month). */
export function defaultFrom(today: string, period: ReportPeriod): string {
  let s = periodStart(today, period);
  const back = period === 'day' ? 29 : 11;
  for (let i = 0; i < back; i++) {
    if (period === 'month') {
      const d = new Date(dayOf(s));
      s = isoOf(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() - 1, 1));
    } else s = isoOf(dayOf(s) - (period === 'week' ? 7 : 1) * DAY);
  }
  return s;
}

/** Whole days from the issue day to `asOf` (both calendar days, UTC). */
export function ageInDays(issuedOn: string, asOf: string): number {
  return Math.max(0, Math.round((dayOf(asOf) - dayOf(issuedOn)) / DAY));
}

/** The usual aged-debt columns: 0–30, 31–60, 61–90 and over 90 days (common practice). */
export function ageBucket(days: number): UnpaidAgeBucket {
  if (days <= 30) return '0-30';
  if (days <= 60) return '31-60';
  if (days <= 90) return '61-90';
  return '90+';
}
