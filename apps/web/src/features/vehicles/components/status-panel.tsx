import { vehicleStatusLabels, vehicleStatuses, type VehicleDetail, type VehicleStatus } from '@tappet/contracts';
import { Button, Dialog, FormDialogFooter, FormMessage, TextField, useToast } from '@tappet/ui';
import { useId, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useMoveVehicle } from '../api/mutations';
import { VehicleStatusBadge } from './status-badge';
import { moveWords } from './words';
import { formatDateTime } from '../../../lib/dates';

/** The current status, when it began, and buttons for the moves the vehicle may make next. */
export function StatusPanel({ shopId, vehicle, canMove }: { shopId: string; vehicle: VehicleDetail; canMove: boolean }) {
  const [target, setTarget] = useState<VehicleStatus | null>(null);
  return (
    <section aria-labelledby="status-heading" className="flex flex-wrap items-center gap-x-6 gap-y-3 rounded-md border border-line bg-surface p-4">
      <h2 id="status-heading" className="text-lg font-bold">
        Status
      </h2>
      <p className="flex flex-wrap items-center gap-2">
        <VehicleStatusBadge status={vehicle.status} /> <span className="text-ink-muted">since {formatDateTime((vehicle.statusSince))}</span>
      </p>
      {canMove && vehicle.nextStatuses.length > 0 && (
        <div className="flex flex-wrap gap-2">
          {vehicle.nextStatuses.map((s) => (
            <Button key={s} variant={vehicleStatuses.indexOf(s) > vehicleStatuses.indexOf(vehicle.status) ? 'primary' : 'secondary'} size="sm" onClick={() => setTarget(s)}>
              {moveWords[s]}
            </Button>
          ))}
        </div>
      )}
      {vehicle.nextStatuses.length === 0 && <p className="text-ink-muted">This vehicle’s stay has ended.</p>}
      {target && <MoveDialog shopId={shopId} vehicle={vehicle} to={target} onClose={() => setTarget(null)} />}
    </section>
  );
}

function MoveDialog({ shopId, vehicle, to, onClose }: { shopId: string; vehicle: VehicleDetail; to: VehicleStatus; onClose: () => void }) {
  const formId = useId();
  const move = useMoveVehicle(shopId, vehicle.id);
  const toast = useToast();
  const [when, setWhen] = useState('');
  const [note, setNote] = useState('');

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    const at = when ? new Date(when).toISOString() : undefined;
    move.mutate(
      { to, at, note: note || null },
      {
        onSuccess: () => {
          toast.show(`Moved to “${vehicleStatusLabels[to]}”.`, 'ok');
          onClose();
        },
      },
    );
  }

  return (
    <Dialog
      open
      onClose={onClose}
      title={`${moveWords[to]}?`}
      description={`From “${vehicleStatusLabels[vehicle.status]}” to “${vehicleStatusLabels[to]}”. The move is recorded with your name.`}
      footer={<FormDialogFooter formId={formId} submitLabel={moveWords[to]} loading={move.isPending} onCancel={onClose} />}
    >
      <form id={formId} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {move.isError && <FormMessage>{errorMessage(move.error)}</FormMessage>}
        <TextField label="When" type="datetime-local" value={when} onChange={(e) => setWhen(e.currentTarget.value)} hint="Now if left empty; never in the future." />
        <TextField label="Note" value={note} onChange={(e) => setNote(e.currentTarget.value)} hint="Optional, e.g. who collected it." maxLength={500} autoComplete="off" />
      </form>
    </Dialog>
  );
}
