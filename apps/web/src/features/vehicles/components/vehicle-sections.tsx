import { odometerInputSchema, type TimelineEntry, type VehicleDetail } from '@tappet/contracts';
import { Button, EmptyState, ErrorState, FormMessage, LoadingState, Num, PartNumber, Select, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { zodFieldErrors, type FieldErrors } from '../../../lib/forms';
import { useTimeline, useVehicleFitment } from '../api/get-vehicle';
import { useAddOdometerReading, useRecordNumbersCheck } from '../api/mutations';
import { optionalInteger } from './form-bits';
import { formatOdometer } from './words';
import { formatCalendarDate, formatDateTime } from '../../../lib/dates';

/** Odometer readings, newest first, each as read and in the shop's unit; with a form to add one. */
export function OdometerPanel({ shopId, vehicle, shopUnit, canEdit }: { shopId: string; vehicle: VehicleDetail; shopUnit: 'mi' | 'km'; canEdit: boolean }) {
  const add = useAddOdometerReading(shopId, vehicle.id);
  const toast = useToast();
  const [value, setValue] = useState('');
  const [unit, setUnit] = useState<'mi' | 'km'>(vehicle.latestOdometer?.unit ?? shopUnit);
  const [readOn, setReadOn] = useState(new Date().toISOString().slice(0, 10));
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    const input = { value: optionalInteger(value), unit, readOn };
    const parsed = odometerInputSchema.safeParse(input);
    if (!parsed.success || input.value === null) {
      setFieldErrors(input.value === null ? { value: 'Enter the reading.' } : zodFieldErrors(parsed.error!));
      return;
    }
    setFieldErrors({});
    add.mutate(parsed.data, {
      onSuccess: () => {
        toast.show('Reading recorded.', 'ok');
        setValue('');
      },
    });
  }

  return (
    <section aria-labelledby="odometer-heading" className="flex flex-col gap-3">
      <h2 id="odometer-heading" className="text-lg font-bold">
        Odometer
      </h2>
      {vehicle.odometerReadings.length === 0 ? (
        <p className="text-ink-muted">No readings yet.</p>
      ) : (
        <table className="w-full text-left">
          <caption className="sr-only">Odometer readings, newest first</caption>
          <thead>
            <tr className="border-b border-line text-sm text-ink-muted">
              <th scope="col" className="py-2 pr-3">
                Read on
              </th>
              <th scope="col" className="py-2 pr-3 text-right">
                Reading
              </th>
              <th scope="col" className="py-2">
                Note
              </th>
            </tr>
          </thead>
          <tbody>
            {vehicle.odometerReadings.map((r) => (
              <tr key={r.id} className="border-b border-line">
                <td className="py-2 pr-3">{formatCalendarDate(r.readOn)}</td>
                <td className="py-2 pr-3 text-right">
                  <Num>{formatOdometer(r.value, r.unit, shopUnit)}</Num>
                </td>
                <td className="py-2 text-ink-muted">{r.note ?? ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {canEdit && (
        <form onSubmit={onSubmit} noValidate aria-label="Add an odometer reading" className="grid grid-cols-1 items-end gap-3 sm:grid-cols-[1fr_auto_1fr_auto]">
          {add.isError && (
            <div className="sm:col-span-4">
              <FormMessage>{errorMessage(add.error)}</FormMessage>
            </div>
          )}
          <TextField label="Reading" inputMode="numeric" value={value} onChange={(e) => setValue(e.currentTarget.value)} error={fieldErrors['value']} autoComplete="off" />
          <Select label="Unit" value={unit} onChange={(e) => setUnit(e.currentTarget.value as 'mi' | 'km')} options={[{ value: 'mi', label: 'mi' }, { value: 'km', label: 'km' }]} />
          <TextField label="Read on" type="date" value={readOn} onChange={(e) => setReadOn(e.currentTarget.value)} error={fieldErrors['readOn']} />
          <Button type="submit" loading={add.isPending}>
            Add reading
          </Button>
        </form>
      )}
    </section>
  );
}

/** Whether frame and engine numbers match the documents, who checked and when; with buttons to record a check. */
export function NumbersPanel({ shopId, vehicle, canEdit }: { shopId: string; vehicle: VehicleDetail; canEdit: boolean }) {
  const record = useRecordNumbersCheck(shopId, vehicle.id);
  const toast = useToast();
  const [note, setNote] = useState('');
  const check = (matching: boolean) =>
    record.mutate(
      { matching, note: note || null },
      {
        onSuccess: () => {
          toast.show(matching ? 'Recorded: numbers match the documents.' : 'Recorded: numbers do not match the documents.', 'ok');
          setNote('');
        },
      },
    );
  return (
    <section aria-labelledby="numbers-heading" className="flex flex-col gap-3 rounded-md border border-line bg-surface p-4">
      <h2 id="numbers-heading" className="text-lg font-bold">
        Numbers matching
      </h2>
      {vehicle.numbersMatching === null ? (
        <p>
          <span aria-hidden="true">○ </span>Not checked against the documents yet.
        </p>
      ) : (
        <p>
          <span className="font-bold">{vehicle.numbersMatching ? '✓ Matching' : '✗ Not matching'}</span> the documents
          {vehicle.numbersCheckedBy ? ` — checked by ${vehicle.numbersCheckedBy.name}` : ''}
          {vehicle.numbersCheckedAt ? ` on ${formatDateTime((vehicle.numbersCheckedAt))}` : ''}.
          {vehicle.numbersNote && <span className="block text-ink-muted">{vehicle.numbersNote}</span>}
        </p>
      )}
      {canEdit && (
        <div className="flex flex-col gap-2">
          {record.isError && <FormMessage>{errorMessage(record.error)}</FormMessage>}
          <TextField label="What was checked" value={note} onChange={(e) => setNote(e.currentTarget.value)} hint="Optional, e.g. the registration document of 1971." maxLength={500} autoComplete="off" />
          <div className="flex flex-wrap gap-2">
            <Button size="sm" onClick={() => check(true)} loading={record.isPending}>
              Numbers match
            </Button>
            <Button size="sm" variant="secondary" onClick={() => check(false)} loading={record.isPending}>
              Numbers do not match
            </Button>
          </div>
        </div>
      )}
    </section>
  );
}

const timelineSymbols: Record<TimelineEntry['kind'], string> = { created: '✚', status: '➜', odometer: '◷', document: '▤', photo: '▣', numbers_check: '#', job: '⚒' };

/** Everything that happened to the vehicle, newest first. */
export function TimelinePanel({ shopId, vehicleId }: { shopId: string; vehicleId: string }) {
  const timeline = useTimeline(shopId, vehicleId);
  return (
    <section aria-labelledby="timeline-heading" className="flex flex-col gap-3">
      <h2 id="timeline-heading" className="text-lg font-bold">
        Timeline
      </h2>
      {timeline.isPending ? (
        <LoadingState label="Loading the timeline…" />
      ) : timeline.isError ? (
        <ErrorState message={errorMessage(timeline.error)} onRetry={() => void timeline.refetch()} />
      ) : (
        <ol className="flex flex-col border-l-2 border-line pl-4">
          {timeline.data.entries.map((e, i) => (
            <li key={`${e.kind}-${e.refId ?? i}`} className="relative py-2">
              <span aria-hidden="true" className="absolute top-2 -left-[1.6rem] flex h-5 w-5 items-center justify-center rounded-full border border-line bg-surface text-xs">
                {timelineSymbols[e.kind]}
              </span>
              <p className="font-bold">{e.title}</p>
              <p className="text-sm text-ink-muted">
                <time dateTime={e.at}>{formatDateTime((e.at))}</time>
                {e.by ? ` · ${e.by.name}` : ''}
              </p>
              {e.detail && <p className="text-sm">{e.detail}</p>}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

/** Parts whose catalogue fitment covers this vehicle, with free stock when known. */
export function FitmentPanel({ shopId, vehicleId, partHref }: { shopId: string; vehicleId: string; partHref: (partId: string) => string }) {
  const fitment = useVehicleFitment(shopId, vehicleId);
  return (
    <section aria-labelledby="fitment-heading" className="flex flex-col gap-3">
      <h2 id="fitment-heading" className="text-lg font-bold">
        Parts that fit
      </h2>
      {fitment.isPending ? (
        <LoadingState label="Finding parts that fit…" />
      ) : fitment.isError ? (
        <ErrorState message={errorMessage(fitment.error)} onRetry={() => void fitment.refetch()} />
      ) : fitment.data.parts.length === 0 ? (
        <EmptyState title="No parts listed for this vehicle">Parts appear here when their catalogue fitment names this marque and model (and covers its year and frame number).</EmptyState>
      ) : (
        <table className="w-full text-left">
          <caption className="sr-only">Parts that fit this vehicle</caption>
          <thead>
            <tr className="border-b border-line text-sm text-ink-muted">
              <th scope="col" className="py-2 pr-3">
                Number
              </th>
              <th scope="col" className="py-2 pr-3">
                Description
              </th>
              <th scope="col" className="py-2 pr-3">
                Frame range
              </th>
              <th scope="col" className="py-2 text-right">
                Free stock
              </th>
            </tr>
          </thead>
          <tbody>
            {fitment.data.parts.map((p) => (
              <tr key={p.partId} className="border-b border-line">
                <td className="py-2 pr-3">
                  <a href={partHref(p.partId)} className="text-accent underline-offset-4 hover:underline">
                    <PartNumber>{p.number}</PartNumber>
                  </a>
                </td>
                <td className="py-2 pr-3">{p.description}</td>
                <td className="py-2 pr-3 text-sm">
                  {p.fitment.frameFrom || p.fitment.frameTo ? (
                    <>
                      <span className="font-mono">
                        {p.fitment.frameFrom ?? '…'} – {p.fitment.frameTo ?? '…'}
                      </span>
                      {p.frameMatch === 'unknown' && <span className="block text-ink-muted">? Check the frame number by eye</span>}
                    </>
                  ) : (
                    <span className="text-ink-muted">All frames</span>
                  )}
                </td>
                <td className="py-2 text-right">
                  {p.freeStock === null ? (
                    <span className="text-ink-muted">not known</span>
                  ) : p.freeStock === 0 ? (
                    <span className="text-ink-muted">none</span>
                  ) : (
                    <>
                      <Num>{p.freeStock}</Num>
                      {p.bins.length > 0 && <span className="block font-mono text-sm text-ink-muted">{p.bins.join(', ')}</span>}
                    </>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
