import type { JobStatus, JobSummary } from '@tappet/contracts';

export { jobStatusWords } from '@tappet/contracts';

/** "1968 Corran Sprint" style title of the job's vehicle. */
export function vehicleLine(v: JobSummary['vehicle']): string {
  return [v.year, v.marque, v.model].filter(Boolean).join(' ');
}

/** The order statuses are shown in on the board. */
export const boardColumns: JobStatus[] = ['open', 'in_progress', 'waiting_parts', 'done', 'cancelled'];

/** Hours and minutes for people: 90 → "1 h 30 min". */
export function hoursWords(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}
