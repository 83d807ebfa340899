/** Plain words for the audit actions the product records; unknown ones are spelled out from the code. */
const actionWords: Record<string, string> = {
  'invitation.created': 'Invited someone',
  'invitation.resent': 'Resent an invitation',
  'invitation.withdrawn': 'Withdrew an invitation',
  'invitation.accepted': 'Accepted an invitation',
  'membership.created': 'Joined the shop',
  'membership.role_changed': 'Changed a role',
  'membership.spending_limit_changed': 'Changed a spending limit',
  'membership.deactivated': 'Deactivated a member',
  'membership.reactivated': 'Reactivated a member',
  'api_key.created': 'Created an API key',
  'api_key.revoked': 'Revoked an API key',
  'settings.updated': 'Changed settings',
  'shop.created': 'Created the shop',
  'shop.updated': 'Changed the shop',
  'shop.exported': 'Downloaded the shop’s data',
  'user.created': 'Created an account',
  'part.created': 'Added a part',
  'part.updated': 'Changed a part',
  'part_link.created': 'Linked parts',
  'part_link.updated': 'Changed a part link',
  'part_link.deleted': 'Removed a part link',
  'fitment.created': 'Added a fitment',
  'fitment.updated': 'Changed a fitment',
  'fitment.deleted': 'Removed a fitment',
  'catalogue.imported': 'Imported a catalogue',
};

/** A sentence-case description of an audit action code. */
export function actionWord(action: string): string {
  const known = actionWords[action];
  if (known) return known;
  const text = action.replace(/[._]/g, ' ').trim();
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The kinds of record the log can be filtered by (value = the API's entity name). */
export const entityOptions = [
  { value: 'invitation', label: 'Invitations' },
  { value: 'membership', label: 'Memberships (people)' },
  { value: 'api_key', label: 'API keys' },
  { value: 'settings', label: 'Settings' },
  { value: 'shop', label: 'The shop' },
  { value: 'part', label: 'Parts' },
  { value: 'part_link', label: 'Part links' },
  { value: 'fitment', label: 'Fitments' },
  { value: 'import', label: 'Imports' },
];

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
