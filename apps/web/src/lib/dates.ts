// Dates and times as every screen shows them, in one place so the screens agree: the day, the
// month's short name and the year ("3 Dec 2026"), never an all-number date, which reads as another
// day in another country (03/12 is the 3rd of December in one and March the 12th in another).
// British English like the rest of the interface; times in the browser's time zone, 24-hour clock.

const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const calendarDay = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const dayAndTime = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
const dayAndTimeToTheSecond = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit' });
const timeOfDay = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/** The day a moment (an ISO time) fell on, where the person is: "3 Dec 2026". */
export function formatDate(moment: string | Date): string {
  return day.format(new Date(moment));
}

/**
 * A calendar date kept without a time ("2026-12-03": a due date, a reading's day): "3 Dec 2026"
 * in every time zone (read as a moment, it would be the day before west of Greenwich).
 */
export function formatCalendarDate(date: string): string {
  return calendarDay.format(new Date(`${date.slice(0, 10)}T00:00:00Z`));
}

/** A moment: "3 Dec 2026, 14:05"; to the second where the order of events matters (the audit log). */
export function formatDateTime(moment: string | Date, options: { seconds?: boolean } = {}): string {
  return (options.seconds ? dayAndTimeToTheSecond : dayAndTime).format(new Date(moment));
}

/** The time of a moment on its day: "14:05". */
export function formatTime(moment: string | Date): string {
  return timeOfDay.format(new Date(moment));
}
