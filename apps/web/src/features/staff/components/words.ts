import { roleLabels, type ShopRole } from '@tappet/contracts';

/** What each role may do, in one line, for the invite dialog and the role picker. */
export const roleHints: Record<ShopRole, string> = {
  owner: 'Everything, including staff, settings, API keys and the audit log.',
  mechanic: 'Looks up parts, sees stock, holds and issues parts to their own jobs.',
  buyer: 'Suppliers, reordering and purchase orders up to a spending limit.',
  viewer: 'Reads the shop’s records; changes nothing.',
};

export const roleOptions = (Object.keys(roleLabels) as ShopRole[]).map((role) => ({ value: role, label: roleLabels[role] }));

/** Minor units as money in the shop's currency ("£1,250.00"). */
export function formatMoney(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat(undefined, { style: 'currency', currency }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency}`;
  }
}

/**
 * A money amount typed in major units ("1250", "1,250.50") as minor units, or null when it is
 * not a plain amount with at most two decimals.
 */
export function parseMajorAmount(text: string): number | null {
  const cleaned = text.replace(/[\s,]/g, '');
  if (!/^\d+(\.\d{1,2})?$/.test(cleaned)) return null;
  const [whole = '0', fraction = ''] = cleaned.split('.');
  return Number(whole) * 100 + Number(fraction.padEnd(2, '0'));
}

// Dates as every screen shows them (lib/dates.ts).
export { formatDate, formatDateTime } from '../../../lib/dates';
