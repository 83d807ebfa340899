import { grantSupportAccessRequestSchema, type SupportActivity } from '@tappet/contracts';
import { Button, ConfirmDialog, createColumnHelper, DataTable, EmptyState, ErrorState, FormMessage, LoadingState, Select, StatusPill, TextField, useToast } from '@tappet/ui';
import { useMemo, useRef, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useGrantSupportAccess, useRevokeSupportAccess, useSupportAccess } from '../api/support-access';
import { formatDateTime } from '../../../lib/dates';

const when = (iso: string) => <time dateTime={iso}>{formatDateTime(iso)}</time>;
const column = createColumnHelper<SupportActivity>();

const durations = [
  { value: '1', label: '1 hour' },
  { value: '4', label: '4 hours' },
  { value: '24', label: '1 day' },
  { value: '72', label: '3 days' },
  { value: '168', label: '7 days' },
];

/** Words for what support did, from the audit action. */
function describeAction(a: SupportActivity): string {
  if (a.action === 'support.viewed') return a.detail.startsWith('GET ') ? 'Looked at' : 'Sent';
  return a.action.replace(/[._]/g, ' ');
}

function GrantForm({ shopId }: { shopId: string }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const grant = useGrantSupportAccess(shopId);
  const toast = useToast();

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const values = formValues(e.currentTarget);
    const parsed = grantSupportAccessRequestSchema.safeParse({ hours: Number(values['hours']), note: values['note'] || undefined });
    if (!parsed.success) return errors.failValidation(parsed.error);
    errors.clear();
    grant.mutate(parsed.data, {
      onSuccess: (g) => toast.show(`Support access granted until ${formatDateTime(g.expiresAt)}.`, 'ok'),
      onError: (err) => errors.failApi(err, ['hours', 'note']),
    });
  }

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex max-w-prose flex-col gap-4 rounded-md border-2 border-line bg-surface p-4">
      <h2 className="text-lg font-bold">Grant support access</h2>
      <p className="text-ink-muted">
        Tappet’s support staff can then see this shop’s data and help fix it, but never staff, API keys, billing or this page. Every page they open and every change they
        make is listed below. You can end it at any time.
      </p>
      {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
      <Select label="For how long" name="hours" options={durations} defaultValue="4" error={errors.fieldErrors['hours']} />
      <TextField label="What do you need help with? (optional)" name="note" hint="Support sees this note." error={errors.fieldErrors['note']} />
      <div>
        <Button type="submit" loading={grant.isPending}>
          Grant support access
        </Button>
      </div>
    </form>
  );
}

/** The owner's support-access page: the grant, ending it, and the audit of what support did. */
export function SupportAccessScreen({ shopId }: { shopId: string }) {
  const support = useSupportAccess(shopId);
  const revoke = useRevokeSupportAccess(shopId);
  const toast = useToast();
  const [confirming, setConfirming] = useState(false);
  const columns = useMemo(
    () => [
      column.accessor('at', { header: 'When', cell: (info) => when(info.getValue()) }),
      column.accessor('actorName', { header: 'Who', cell: (info) => info.getValue() ?? 'Tappet support' }),
      column.accessor((a) => describeAction(a), { id: 'what', header: 'What' }),
      column.accessor('detail', { header: 'Details', cell: (info) => <span className="font-mono text-sm break-all">{info.getValue()}</span> }),
    ],
    [],
  );

  if (support.isPending) return <LoadingState label="Loading support access…" />;
  if (support.isError) return <ErrorState message={errorMessage(support.error)} onRetry={() => void support.refetch()} />;
  const { current, grants, activity } = support.data;

  return (
    <div className="flex flex-col gap-6">
      {current ? (
        <section aria-labelledby="current-grant" className="flex max-w-prose flex-col gap-3 rounded-md border-2 border-advise bg-advise-soft p-4">
          <div className="flex flex-wrap items-center gap-3">
            <h2 id="current-grant" className="text-lg font-bold">
              Support can see this shop
            </h2>
            <StatusPill status="advise" label="Granted" />
          </div>
          <p>
            Until {when(current.expiresAt)}
            {current.grantedByName ? <>, granted by {current.grantedByName}</> : null}.{current.note ? <> Note: “{current.note}”</> : null}
          </p>
          <div>
            <Button variant="secondary" onClick={() => setConfirming(true)}>
              End support access now
            </Button>
          </div>
        </section>
      ) : (
        <GrantForm shopId={shopId} />
      )}

      <section aria-labelledby="support-activity" className="flex flex-col gap-3">
        <h2 id="support-activity" className="text-lg font-bold">
          What support did
        </h2>
        <DataTable
          caption="What support did"
          columns={columns}
          data={activity}
          getRowId={(a) => a.id}
          empty={<EmptyState title="Nothing yet">Every page support opens and every change it makes in this shop is listed here.</EmptyState>}
        />
      </section>

      {grants.length > 0 && (
        <section aria-labelledby="past-grants" className="flex flex-col gap-2">
          <h2 id="past-grants" className="text-lg font-bold">
            Grants
          </h2>
          <ul className="flex flex-col gap-1">
            {grants.map((g) => (
              <li key={g.id} className="flex flex-wrap items-center gap-2">
                {g.active ? <StatusPill status="advise" label="Active" /> : <StatusPill status="na" label={g.revokedAt ? 'Ended early' : 'Expired'} />}
                <span>
                  {when(g.createdAt)} to {when(g.revokedAt ?? g.expiresAt)}
                  {g.grantedByName ? ` · ${g.grantedByName}` : ''}
                </span>
              </li>
            ))}
          </ul>
        </section>
      )}

      <ConfirmDialog
        open={confirming}
        onCancel={() => {
          revoke.reset();
          setConfirming(false);
        }}
        title="End support access now?"
        message={
          <div className="flex flex-col gap-2">
            <p>Support loses sight of this shop at once. What they did stays listed on this page and in the audit log.</p>
            {revoke.isError && (
              <p role="alert" className="font-bold text-fail">
                {errorMessage(revoke.error)}
              </p>
            )}
          </div>
        }
        confirmLabel="End support access"
        destructive
        loading={revoke.isPending}
        onConfirm={() =>
          revoke.mutate(undefined, {
            onSuccess: () => {
              toast.show('Support access has ended.', 'ok');
              setConfirming(false);
            },
          })
        }
      />
    </div>
  );
}
