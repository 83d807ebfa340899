import { describe, expect, it } from 'vitest';
import { formatCalendarDate, formatDate, formatDateTime, formatTime } from './dates';

// Expected strings written out by hand from the CLDR en-GB patterns ("d MMM y", "HH:mm"). Moments
// are made in the test's own time zone, as the screens show them in the browser's.
describe('dates as the screens show them', () => {
  it('spells the month, so 3 December never reads as March the 12th', () => {
    const moment = new Date(2026, 11, 3, 14, 5, 9);
    expect(formatDate(moment)).toBe('3 Dec 2026');
    expect(formatDate(moment.toISOString())).toBe('3 Dec 2026');
    expect(formatDateTime(moment)).toBe('3 Dec 2026, 14:05');
    expect(formatDateTime(moment.toISOString(), { seconds: true })).toBe('3 Dec 2026, 14:05:09');
    expect(formatTime(new Date(2026, 11, 3, 9, 7))).toBe('09:07');
  });

  it('keeps a calendar date on its own day, whatever the time zone', () => {
    expect(formatCalendarDate('2026-01-31')).toBe('31 Jan 2026');
    expect(formatCalendarDate('2026-03-01T00:00:00.000Z')).toBe('1 Mar 2026');
  });
});
