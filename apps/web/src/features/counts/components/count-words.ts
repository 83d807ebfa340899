import type { CountStatus, StockCondition } from '@tappet/contracts';

/** What each count status is called on screen. */
export const countStatusWords: Record<CountStatus, string> = { open: 'In progress', posted: 'Posted', abandoned: 'Abandoned' };

/** Conditions as people say them. */
export const conditionWords: Record<StockCondition, string> = {
  new: 'New',
  nos: 'New old stock',
  used_good: 'Used, good',
  used_fair: 'Used, fair',
  reconditioned: 'Reconditioned',
  core: 'Core',
};

/** A signed quantity difference: "+2", "−1", "0". */
export function signed(n: number): string {
  if (n > 0) return `+${n}`;
  if (n < 0) return `−${Math.abs(n)}`;
  return '0';
}

/** Part numbers and scanned codes compared as the catalogue does: letters and digits only, upper case. */
export function codeKey(code: string): string {
  return code.toUpperCase().replace(/[^A-Z0-9]/g, '');
}
