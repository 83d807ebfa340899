import { auditActionWords, auditEntityLabels } from '@tappet/contracts';

/** Plain words for an audit action code; a code the contracts do not know (recorded by an older version) is spelled out. */
export function actionWord(action: string): string {
  const known = (auditActionWords as Record<string, string>)[action];
  if (known) return known;
  const text = action.replace(/[._]/g, ' ').trim();
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The kinds of record the log can be filtered by (value = the API's entity name), in the order of their names. */
export const entityOptions = Object.entries(auditEntityLabels)
  .map(([value, label]) => ({ value, label }))
  .sort((x, y) => x.label.localeCompare(y.label, 'en'));

/** One value of a changed field, as short readable text. */
export function showValue(value: unknown): string {
  if (value === null || value === undefined || value === '') return '(none)';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return JSON.stringify(value);
}

/** camelCase field names as words ("spendingLimitMinor" → "spending limit minor"). */
export function fieldWords(field: string): string {
  return field.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/_/g, ' ').toLowerCase();
}
