import type { OdometerUnit, VehicleCondition, VehicleKind, VehicleStatus } from '@tappet/contracts';
import { convert } from '@tappet/domain';

export const kindWords: Record<VehicleKind, string> = {
  customer: 'Customer’s vehicle',
  shop_stock: 'Shop stock',
  consignment: 'Consignment',
};

/** What the button that moves a vehicle to each status says. */
export const moveWords: Record<VehicleStatus, string> = {
  arrived: 'Back in',
  assessing: 'Start assessment',
  in_work: 'Start work',
  ready: 'Mark ready',
  handed_over: 'Hand over',
  sold: 'Mark sold',
};

/** Tappet's own condition words, each with a line that says what it means in the shop. */
export const conditionWords: Record<VehicleCondition, { label: string; meaning: string }> = {
  incomplete: { label: 'Incomplete', meaning: 'Major parts missing; a heap to be sorted and sourced.' },
  complete_project: { label: 'Complete project', meaning: 'All there, but needs taking apart and rebuilding.' },
  runs_needs_work: { label: 'Runs, needs work', meaning: 'Starts and moves; known faults to put right.' },
  sorted_rider: { label: 'Sorted rider', meaning: 'Used and cared for; small jobs only.' },
  freshly_restored: { label: 'Freshly restored', meaning: 'Rebuilt and finished; little or no use since.' },
};

/** Shape and word for each status, so no state is told by colour alone. */
export const statusSymbols: Record<VehicleStatus, string> = {
  arrived: '↘',
  assessing: '◔',
  in_work: '◑',
  ready: '●',
  handed_over: '↗',
  sold: '✓',
};

const whole = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/**
 * An odometer reading as read, and in the shop's unit when that differs:
 * "23,110 mi (37,192 km)". Conversion uses the exact mile of NIST SP 811 (1.609344 km).
 */
export function formatOdometer(value: number, unit: OdometerUnit, shopUnit?: OdometerUnit): string {
  const read = `${whole.format(value)}\u00a0${unit}`;
  if (!shopUnit || shopUnit === unit) return read;
  return `${read} (${whole.format(convert(value, unit, shopUnit))}\u00a0${shopUnit})`;
}

/** A short name for a vehicle: "1966 Corran Meadowlark 350". */
export function vehicleTitle(v: { year: number | null; marque: string; model: string }): string {
  return [v.year, v.marque, v.model].filter(Boolean).join(' ');
}

/** Bytes for people: "1.2 MB". */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
