import { vehicleStatusLabels, type VehicleStatus } from '@tappet/contracts';
import { cn } from '@tappet/ui';
import { statusSymbols } from './words';

/** A vehicle's status as a word with a shape: readable without colour. */
export function VehicleStatusBadge({ status, className }: { status: VehicleStatus; className?: string }) {
  const closed = status === 'handed_over' || status === 'sold';
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-bold whitespace-nowrap', closed ? 'border-line text-ink-muted' : 'border-accent text-accent', className)}>
      <span aria-hidden="true">{statusSymbols[status]}</span>
      {vehicleStatusLabels[status]}
    </span>
  );
}
