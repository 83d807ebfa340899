import { jobStatusWords, type Checklist, type JobDetail, type JobStatus } from '@tappet/contracts';
import { safetyDeferral, type PressureUnit } from '@tappet/domain';
import { Button, buttonClasses, Caution, ConfirmDialog, Dialog, FormDialogFooter, FormMessage, inputClasses, Panel, PartNumber, Select, TextField, useToast } from '@tappet/ui';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { jobFileHref, jobSheetHref } from '../api/get-job';
import { useTemplates } from '../api/get-templates';
import {
  useAddLabour,
  useCompleteChecklist,
  useIssuePart,
  useMoveJob,
  useRecordItem,
  useRemoveLabour,
  useReleaseHold,
  useReturnPart,
  useSignOff,
  useStartChecklist,
} from '../api/mutations';
import { ChecklistItemCard } from './checklist-item';
import { AssignDialog } from './assign-dialog';
import { EditJobDialog } from './edit-job-dialog';
import { JobPhotos } from './job-photos';
import { PartsFinder } from './parts-finder';
import { JobStatusBadge } from './job-status-badge';
import { hoursWords, vehicleLine } from './words';
import { formatCalendarDate, formatDate, formatDateTime } from '../../../lib/dates';

export interface JobPermissions {
  /** Record checklists, labour, status: owner, or a mechanic assigned to the job. */
  work: boolean;
  hold: boolean;
  issue: boolean;
  signOff: boolean;
  /** Choose who works on the job: the owner. */
  assign?: boolean;
}

const specialOrderWords: Record<JobDetail['specialOrders'][number]['status'], string> = { open: 'to be ordered', ordered: 'ordered', received: 'received', cancelled: 'cancelled' };

const moveLabels: Record<JobStatus, string> = { open: 'Reopen', in_progress: 'Start work', waiting_parts: 'Waiting for parts', done: 'Mark done', cancelled: 'Cancel job' };

/** The job page: request, people, status moves, safety blockers, checklists, parts, labour and cost. */
export function JobView({ shopId, job, can, pressureUnit, meId, formatMoney }: { shopId: string; job: JobDetail; can: JobPermissions; pressureUnit: PressureUnit; meId: string | null; formatMoney: (minor: number) => string }) {
  const toast = useToast();
  const move = useMoveJob(shopId, job.id);
  const [moveError, setMoveError] = useState<string | null>(null);
  const [assigning, setAssigning] = useState(false);
  const [editing, setEditing] = useState(false);
  const open = job.status !== 'done' && job.status !== 'cancelled';

  const doMove = async (to: JobStatus) => {
    setMoveError(null);
    try {
      await move.mutateAsync({ to });
      toast.show(`Job ${job.number}: ${jobStatusWords[to]}.`);
    } catch (e) {
      setMoveError(errorMessage(e));
    }
  };

  return (
    <div className="flex flex-col gap-6">
      <Panel
        title="The job"
        actions={
          can.work && (
            <div className="flex flex-wrap gap-2">
              {job.moves.map((to) => (
                <Button key={to} variant={to === 'done' ? 'primary' : 'secondary'} onClick={() => void doMove(to)} loading={move.isPending && move.variables?.to === to}>
                  {moveLabels[to]}
                </Button>
              ))}
            </div>
          )
        }
      >
        <dl className="grid gap-3 sm:grid-cols-2">
          <div>
            <dt className="text-sm font-bold text-ink-muted">Vehicle</dt>
            <dd>
              <Link className="text-accent underline underline-offset-4" to={paths.shop.vehicle.getHref(shopId, job.vehicle.id)}>
                {vehicleLine(job.vehicle)}
              </Link>
              {job.vehicle.frameNumber && <span className="ml-2 font-mono">{job.vehicle.frameNumber}</span>}
            </dd>
          </div>
          <div>
            <dt className="text-sm font-bold text-ink-muted">Status</dt>
            <dd>
              <JobStatusBadge status={job.status} />
            </dd>
          </div>
          <div className="sm:col-span-2">
            <dt className="text-sm font-bold text-ink-muted">What the customer asked for</dt>
            <dd className="whitespace-pre-wrap">{job.customerRequest || '—'}</dd>
          </div>
          <div>
            <dt className="text-sm font-bold text-ink-muted">Assigned to</dt>
            <dd className="flex flex-wrap items-center gap-2">
              {job.assignees.length ? job.assignees.map((a) => a.name).join(', ') : 'Nobody yet'}
              {can.assign && (
                <Button variant="ghost" size="sm" onClick={() => setAssigning(true)}>
                  Change who works on it
                </Button>
              )}
            </dd>
          </div>
          <div>
            <dt className="text-sm font-bold text-ink-muted">Dates</dt>
            <dd>
              Opened {formatDate(job.createdAt)}
              {job.dueOn && ` · due ${formatCalendarDate(job.dueOn)}`}
              {job.completedAt && ` · done ${formatDate(job.completedAt)}`}
            </dd>
          </div>
          {job.notes && (
            <div className="sm:col-span-2">
              <dt className="text-sm font-bold text-ink-muted">Notes</dt>
              <dd className="whitespace-pre-wrap">{job.notes}</dd>
            </div>
          )}
        </dl>
        <p className="mt-3 flex flex-wrap gap-2">
          <a className={buttonClasses('secondary', 'sm')} href={jobSheetHref(shopId, job.id)} target="_blank" rel="noreferrer">
            Print the job sheet (PDF)
          </a>
          {can.work && (
            <Button variant="secondary" size="sm" onClick={() => setEditing(true)}>
              Edit the job
            </Button>
          )}
        </p>
        {moveError && (
          <div className="mt-3">
            <FormMessage>{moveError}</FormMessage>
          </div>
        )}
        {assigning && <AssignDialog shopId={shopId} job={job} onClose={() => setAssigning(false)} />}
        {editing && <EditJobDialog shopId={shopId} job={job} onClose={() => setEditing(false)} />}
      </Panel>

      <Blockers shopId={shopId} job={job} canSignOff={can.signOff} />

      <Checklists shopId={shopId} job={job} editable={can.work && open} pressureUnit={pressureUnit} />

      <Parts shopId={shopId} job={job} can={can} open={open} formatMoney={formatMoney} />

      <Labour shopId={shopId} job={job} editable={can.work && open} meId={meId} anyone={Boolean(can.assign)} formatMoney={formatMoney} />

      <Panel title="Cost so far">
        <dl className="grid max-w-md grid-cols-2 gap-2">
          <dt>Parts at cost</dt>
          <dd className="text-right font-mono tabular-nums">{formatMoney(job.cost.partsMinor)}</dd>
          <dt>Labour ({hoursWords(job.cost.labourMinutes)})</dt>
          <dd className="text-right font-mono tabular-nums">{formatMoney(job.cost.labourMinor)}</dd>
          <dt className="font-bold">Total</dt>
          <dd className="text-right font-mono font-bold tabular-nums">{formatMoney(job.cost.totalMinor)}</dd>
        </dl>
      </Panel>

      <Panel title="Photos">
        <JobPhotos shopId={shopId} job={job} canUpload={can.work} />
      </Panel>
    </div>
  );
}

/** Safety-critical items that keep the job from being marked done, with the owner's sign-off. */
function Blockers({ shopId, job, canSignOff }: { shopId: string; job: JobDetail; canSignOff: boolean }) {
  const [signing, setSigning] = useState<JobDetail['blockers'][number] | null>(null);
  if (job.blockers.length === 0 && job.signOffs.length === 0) return null;
  // Failed items are shown in full; items not yet recorded fold away (a new job has many).
  const failed = job.blockers.filter((b) => b.reason === 'failed');
  const unrecorded = job.blockers.filter((b) => b.reason === 'unrecorded');
  return (
    <Panel title="Safety-critical items">
      {job.blockers.length > 0 && (
        <>
          <p className="mb-2">
            The job cannot be marked done while these are failed or not recorded. Fix and record them, or the owner signs them off with the reason and a record that the customer was told.
          </p>
          <ul className="mb-3 flex flex-col gap-2">
            {failed.map((b) => (
              <li key={`${b.checklistId}-${b.key}`} className="flex flex-wrap items-center justify-between gap-2 rounded-md border-2 border-fail p-3">
                <span>
                  <strong>{b.label}</strong> — {b.reason === 'failed' ? 'failed' : 'not recorded'} <span className="text-ink-muted">({b.checklistName})</span>
                </span>
                {canSignOff && (
                  <Button variant="secondary" onClick={() => setSigning(b)} aria-label={`Sign off: ${b.label}`}>
                    Sign off
                  </Button>
                )}
              </li>
            ))}
          </ul>
          {unrecorded.length > 0 && (
            <details className="mb-3">
              <summary className="min-h-touch cursor-pointer py-2 font-bold">
                {unrecorded.length} safety-critical item{unrecorded.length === 1 ? ' is' : 's are'} not recorded yet
              </summary>
              <ul className="flex flex-col gap-2">
                {unrecorded.map((b) => (
                  <li key={`${b.checklistId}-${b.key}`} className="flex flex-wrap items-center justify-between gap-2 rounded-md border-2 border-line-strong p-3">
                    <span>
                      {b.label} <span className="text-ink-muted">({b.checklistName})</span>
                    </span>
                    {canSignOff && (
                      <Button variant="ghost" onClick={() => setSigning(b)} aria-label={`Sign off: ${b.label}`}>
                        Sign off
                      </Button>
                    )}
                  </li>
                ))}
              </ul>
            </details>
          )}
        </>
      )}
      {job.signOffs.length > 0 && (
        <ul className="flex flex-col gap-2">
          {job.signOffs.map((s) => (
            <li key={s.id} className="rounded-md border-2 border-line-strong p-3 text-sm">
              <strong>Unresolved, signed off</strong> by {s.signedBy?.name ?? 'the owner'} on {formatDateTime(s.signedAt)}: {s.reason} Customer told: {s.customerToldHow}
            </li>
          ))}
        </ul>
      )}
      {signing && <SignOffDialog shopId={shopId} jobId={job.id} blocker={signing} onClose={() => setSigning(null)} />}
    </Panel>
  );
}

function SignOffDialog({ shopId, jobId, blocker, onClose }: { shopId: string; jobId: string; blocker: JobDetail['blockers'][number]; onClose: () => void }) {
  const signOff = useSignOff(shopId, jobId);
  const [reason, setReason] = useState('');
  const [told, setTold] = useState('');
  const [confirmed, setConfirmed] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <Dialog open onClose={onClose} title={`Sign off: ${blocker.label}`} description="The item stays on record as unresolved; the job can then be marked done." footer={<FormDialogFooter formId="sign-off-form" submitLabel="Sign off" loading={signOff.isPending} onCancel={onClose} />}>
      <form
        id="sign-off-form"
        noValidate
        className="flex flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          if (!confirmed) return setError('Confirm that the customer was told.');
          signOff.mutateAsync({ checklistId: blocker.checklistId, itemKey: blocker.key, reason, customerTold: true, customerToldHow: told }).then(onClose, (err: unknown) => setError(errorMessage(err)));
        }}
      >
        {error && <FormMessage>{error}</FormMessage>}
        <label className="flex flex-col gap-1">
          <span className="font-bold">Reason</span>
          <textarea rows={3} className={inputClasses(false)} value={reason} onChange={(e) => setReason(e.target.value)} />
        </label>
        <TextField label="How and when the customer was told" value={told} onChange={(e) => setTold(e.target.value)} />
        <label className="flex min-h-touch items-center gap-2">
          <input type="checkbox" className="h-5 w-5" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} />
          The customer was told this item is unresolved.
        </label>
      </form>
    </Dialog>
  );
}

function Checklists({ shopId, job, editable, pressureUnit }: { shopId: string; job: JobDetail; editable: boolean; pressureUnit: PressureUnit }) {
  const templates = useTemplates(shopId, { enabled: editable });
  const start = useStartChecklist(shopId, job.id);
  const [templateId, setTemplateId] = useState('');
  return (
    <Panel title="Checklists">
      <p className="mb-4 text-sm text-ink-muted">{safetyDeferral}</p>
      {job.checklists.length === 0 && <p className="mb-4">No checklist on this job yet.</p>}
      {job.checklists.map((c) => (
        <ChecklistBlock key={c.id} shopId={shopId} job={job} checklist={c} editable={editable && !c.completedAt} pressureUnit={pressureUnit} />
      ))}
      {editable && (
        <div className="mt-4 flex flex-wrap items-end gap-2">
          <Select label="Start a checklist" placeholder="Choose a template" value={templateId} onChange={(e) => setTemplateId(e.target.value)} options={(templates.data?.templates ?? []).filter((t) => !t.archived).map((t) => ({ value: t.id, label: t.name }))} />
          <Button variant="secondary" disabled={!templateId} loading={start.isPending} onClick={() => void start.mutateAsync(templateId).then(() => setTemplateId(''))}>
            Start
          </Button>
        </div>
      )}
    </Panel>
  );
}

function ChecklistBlock({ shopId, job, checklist, editable, pressureUnit }: { shopId: string; job: JobDetail; checklist: Checklist; editable: boolean; pressureUnit: PressureUnit }) {
  const record = useRecordItem(shopId, job.id);
  const complete = useCompleteChecklist(shopId, job.id);
  const [error, setError] = useState<string | null>(null);
  const sections = [...new Set(checklist.items.map((i) => i.section))];
  const photos = job.files.map((f) => ({ id: f.id, label: f.caption ?? f.originalName, thumbnailHref: jobFileHref(shopId, job.id, f.id), href: jobFileHref(shopId, job.id, f.id, 'content') }));
  const recorded = Object.keys(checklist.records).length;
  const hasSafetyCautions = checklist.items.some((i) => i.cautions.includes('fuel_fire') || i.cautions.includes('brake_fluid'));
  return (
    <div className="mb-6">
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-lg font-bold">
          {checklist.name}{' '}
          <span className="text-ink-muted">
            ({recorded}/{checklist.items.length} recorded)
          </span>
        </h3>
        {editable && (
          <Button variant="secondary" loading={complete.isPending} onClick={() => complete.mutateAsync(checklist.id).then(() => setError(null), (e: unknown) => setError(errorMessage(e)))}>
            Complete checklist
          </Button>
        )}
      </div>
      {checklist.completedAt && (
        <p className="mb-2">
          Completed by {checklist.completedBy?.name ?? 'someone'} on {formatDateTime(checklist.completedAt)}. This records what was checked, by whom and when.
        </p>
      )}
      {error && <FormMessage>{error}</FormMessage>}
      {hasSafetyCautions && editable && (
        <Caution title="Brakes, tyres, fuel and electrics can hurt people">
          Follow local regulations and licensed practice for this work. Each item below shows the cautions that belong to it when you record it.
        </Caution>
      )}
      {sections.map((section) => (
        <div key={section} className="mt-4">
          <h4 className="mb-2 text-sm font-bold tracking-wide text-ink-muted uppercase">{section}</h4>
          <ul className="flex flex-col gap-3">
            {checklist.items
              .filter((i) => i.section === section)
              .map((item) => (
                <ChecklistItemCard
                  key={item.key}
                  item={item}
                  record={checklist.records[item.key]}
                  signedOff={job.signOffs.some((s) => s.checklistId === checklist.id && s.itemKey === item.key)}
                  editable={editable}
                  pressureUnit={pressureUnit}
                  photos={photos}
                  saving={record.isPending && record.variables?.itemKey === item.key}
                  onSave={async (input) => {
                    await record.mutateAsync({ checklistId: checklist.id, itemKey: item.key, input });
                  }}
                />
              ))}
          </ul>
        </div>
      ))}
    </div>
  );
}

function Parts({ shopId, job, can, open, formatMoney }: { shopId: string; job: JobDetail; can: JobPermissions; open: boolean; formatMoney: (minor: number) => string }) {
  const [error, setError] = useState<string | null>(null);
  const issue = useIssuePart(shopId, job.id);
  const ret = useReturnPart(shopId, job.id);
  const release = useReleaseHold(shopId, job.id);
  const run = (p: Promise<unknown>) => p.then(() => setError(null), (e: unknown) => setError(errorMessage(e)));
  const activeHolds = job.holds.filter((h) => h.status === 'active');
  return (
    <Panel title="Parts">
      {error && <FormMessage>{error}</FormMessage>}
      {open && (can.hold || can.work) && <PartsFinder shopId={shopId} jobId={job.id} canHold={can.hold} canOrder={can.work} />}
      <h3 className="mb-2 font-bold">Held for this job</h3>
      {activeHolds.length === 0 ? (
        <p className="mb-4 text-ink-muted">Nothing held.</p>
      ) : (
        <ul className="mb-4 flex flex-col gap-2">
          {activeHolds.map((h) => (
            <li key={h.id} className="flex flex-wrap items-center justify-between gap-2 rounded-md border-2 border-line p-2">
              <span>
                {h.quantity} × <PartNumber>{h.partNumber}</PartNumber> {h.partDescription} · bin <span className="font-mono">{h.binCode}</span>
              </span>
              <span className="flex gap-2">
                {can.issue && open && (
                  <Button onClick={() => void run(issue.mutateAsync({ holdId: h.id, quantity: h.quantity }))} loading={issue.isPending} aria-label={`Issue ${h.quantity} × ${h.partNumber} to this job`}>
                    Issue to job
                  </Button>
                )}
                {can.hold && open && (
                  <Button variant="ghost" onClick={() => void run(release.mutateAsync(h.id))} aria-label={`Release hold of ${h.partNumber}`}>
                    Release
                  </Button>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
      <h3 className="mb-2 font-bold">Issued to this job</h3>
      {job.partLines.length === 0 ? (
        <p className="text-ink-muted">Nothing issued yet.</p>
      ) : (
        <table className="w-full text-left">
          <thead>
            <tr>
              <th scope="col">Part</th>
              <th scope="col" className="text-right">
                Quantity
              </th>
              <th scope="col" className="text-right">
                Cost
              </th>
              {can.issue && open && <th scope="col"><span className="sr-only">Actions</span></th>}
            </tr>
          </thead>
          <tbody>
            {job.partLines.map((l) => {
              const last = [...job.movements].reverse().find((m) => m.partId === l.partId && m.kind === 'issued');
              return (
                <tr key={l.partId} className="border-t border-line">
                  <td className="py-2">
                    <PartNumber>{l.partNumber}</PartNumber> {l.partDescription}
                  </td>
                  <td className="text-right font-mono tabular-nums">{l.quantity}</td>
                  <td className="text-right font-mono tabular-nums">{formatMoney(l.costMinor)}</td>
                  {can.issue && open && (
                    <td className="text-right">
                      {last && l.quantity > 0 && (
                        <Button variant="ghost" size="sm" onClick={() => void run(ret.mutateAsync({ partId: l.partId, binId: last.binId, condition: last.condition, quantity: 1 }))} aria-label={`Return one ${l.partNumber} to stock`}>
                          Return one
                        </Button>
                      )}
                    </td>
                  )}
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {job.specialOrders.length > 0 && (
        <>
          <h3 className="mt-4 mb-2 font-bold">Special orders</h3>
          <ul className="flex flex-col gap-1">
            {job.specialOrders.map((o) => (
              <li key={o.id}>
                {o.quantity} × <PartNumber>{o.partNumber}</PartNumber> {o.partDescription} — {specialOrderWords[o.status]}
                {o.note && <span className="text-ink-muted"> ({o.note})</span>}
              </li>
            ))}
          </ul>
        </>
      )}
    </Panel>
  );
}

function Labour({ shopId, job, editable, meId, anyone, formatMoney }: { shopId: string; job: JobDetail; editable: boolean; meId: string | null; anyone: boolean; formatMoney: (minor: number) => string }) {
  const add = useAddLabour(shopId, job.id);
  const remove = useRemoveLabour(shopId, job.id);
  const [removing, setRemoving] = useState<JobDetail['labour'][number] | null>(null);
  const [hours, setHours] = useState('');
  const [description, setDescription] = useState('');
  const [workedOn, setWorkedOn] = useState(() => new Date().toISOString().slice(0, 10));
  const [error, setError] = useState<string | null>(null);
  const submit = () => {
    const minutes = Math.round(Number(hours.replace(',', '.')) * 60);
    if (!meId) return;
    if (!Number.isFinite(minutes) || minutes < 1) return setError('Enter the hours worked, e.g. 1.5.');
    add.mutateAsync({ userId: meId, workedOn, minutes, description }).then(
      () => {
        setHours('');
        setDescription('');
        setError(null);
      },
      (e: unknown) => setError(errorMessage(e)),
    );
  };
  return (
    <Panel title="Labour">
      <ConfirmDialog
        open={removing !== null}
        destructive
        title="Remove this time?"
        message={removing ? `${hoursWords(removing.minutes)} booked by ${removing.user.name} on ${removing.workedOn} (“${removing.description}”) comes off the job and its cost.` : ''}
        confirmLabel="Remove"
        loading={remove.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() => {
          if (!removing) return;
          remove.mutateAsync(removing.id).then(
            () => setRemoving(null),
            (e: unknown) => {
              setRemoving(null);
              setError(errorMessage(e));
            },
          );
        }}
      />
      {job.labour.length === 0 ? (
        <p className="mb-3 text-ink-muted">No time booked yet.</p>
      ) : (
        <ul className="mb-3 flex flex-col gap-1">
          {job.labour.map((l) => (
            <li key={l.id} className="flex flex-wrap justify-between gap-2 border-b border-line py-1">
              <span>
                {l.workedOn} · {l.user.name} · {l.description}
              </span>
              <span className="flex items-center gap-2">
                <span className="font-mono tabular-nums">
                  {hoursWords(l.minutes)} · {formatMoney(l.costMinor)}
                </span>
                {editable && (anyone || l.user.id === meId) && (
                  <Button variant="ghost" size="sm" onClick={() => setRemoving(l)} aria-label={`Remove ${hoursWords(l.minutes)} of ${l.user.name} on ${l.workedOn}`}>
                    Remove
                  </Button>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
      {editable && meId && (
        <form
          className="flex flex-wrap items-end gap-2"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            submit();
          }}
        >
          <TextField label="Hours" inputMode="decimal" value={hours} onChange={(e) => setHours(e.target.value)} fieldClassName="w-28" />
          <TextField label="Worked on" type="date" value={workedOn} onChange={(e) => setWorkedOn(e.target.value)} fieldClassName="w-44" />
          <TextField label="What was done" value={description} onChange={(e) => setDescription(e.target.value)} fieldClassName="min-w-64 flex-1" />
          <Button type="submit" loading={add.isPending}>
            Book my time
          </Button>
          {error && <FormMessage>{error}</FormMessage>}
        </form>
      )}
    </Panel>
  );
}
