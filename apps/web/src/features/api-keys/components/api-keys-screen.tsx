import { apiKeyPrefix, createApiKeyRequestSchema, type ApiKeySummary, type CreateApiKeyResponse } from '@tappet/contracts';
import { Badge, Button, ConfirmDialog, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormMessage, IconAdvise, LoadingState, Select, StatusPill, TextField, useToast } from '@tappet/ui';
import { useMemo, useRef, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useCreateApiKey } from '../api/create-api-key';
import { useApiKeys } from '../api/get-api-keys';
import { useRevokeApiKey } from '../api/revoke-api-key';
import { formatDateTime } from '../../../lib/dates';

const column = createColumnHelper<ApiKeySummary>();
const when = (iso: string) => <time dateTime={iso}>{formatDateTime(iso)}</time>;

const roleOptions = [
  { value: 'viewer', label: 'Viewer: reads the shop’s records' },
  { value: 'buyer', label: 'Parts buyer: suppliers, reordering, purchase orders' },
];

/** Create-key form, then the secret shown once. */
function CreateKeyDialog({ shopId, open, onClose, myName }: { shopId: string; open: boolean; onClose: () => void; myName: string }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const create = useCreateApiKey(shopId);
  const [boundTo, setBoundTo] = useState<'me' | 'integration'>('integration');
  const [created, setCreated] = useState<CreateApiKeyResponse | null>(null);
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);

  function close() {
    // The secret leaves memory with the dialog: it cannot be shown again.
    setCreated(null);
    setCopied(null);
    errors.clear();
    create.reset();
    onClose();
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const parsed = createApiKeyRequestSchema.safeParse({
      label: values.label ?? '',
      role: values.role,
      ...(boundTo === 'integration' ? { integrationName: values.integrationName ?? '' } : {}),
    });
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    create.mutate(parsed.data, { onSuccess: setCreated, onError: (error) => errors.failApi(error, ['label', 'role', 'integrationName']) });
  }

  async function copy(secret: string) {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied('yes');
    } catch {
      setCopied('failed');
    }
  }

  if (created) {
    return (
      <Dialog open={open} onClose={close} title={`Key “${created.key.label}” created`} description="Copy the key now. It is shown this once and never again.">
        <div className="flex flex-col gap-4">
          <div className="flex gap-3 rounded-md border-2 border-advise bg-advise-soft p-3 text-ink">
            <IconAdvise className="mt-0.5 shrink-0 text-advise" />
            <p>
              <span className="font-bold">This is the only time you can see this key.</span> Store it where the integration keeps its secrets now. Tappet
              keeps only a fingerprint of it, so nobody can show it to you again.
            </p>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="new-api-key" className="font-bold">
              The new key
            </label>
            {/* A textarea so the whole key is visible (it wraps), read-only and selected on focus. */}
            <textarea
              id="new-api-key"
              readOnly
              rows={2}
              value={created.secret}
              onFocus={(e) => e.currentTarget.select()}
              className="block min-h-touch w-full resize-none rounded-md border-2 border-line-strong bg-sunk px-3 py-2 font-mono text-num break-all"
            />
          </div>
          <p className="text-sm text-ink-muted">
            Send it as <span className="font-mono">Authorization: Bearer {apiKeyPrefix}…</span>. Lost it? Revoke this key and create a new one.
          </p>
          <div className="flex flex-wrap items-center justify-end gap-3 border-t border-line pt-4">
            <p role="status" className="mr-auto text-sm font-bold">
              {copied === 'yes' ? 'Copied to the clipboard.' : copied === 'failed' ? 'Copying failed: select the key and copy it by hand.' : ''}
            </p>
            <Button variant="secondary" onClick={() => void copy(created.secret)}>
              Copy the key
            </Button>
            <Button onClick={close}>I have stored it</Button>
          </div>
        </div>
      </Dialog>
    );
  }

  return (
    <Dialog open={open} onClose={close} title="Create an API key" description="For an integration that reads the shop or places orders. Keys never manage staff, keys, billing or settings.">
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Label" name="label" hint="What it is for, e.g. “Stock sync to the web shop”." error={errors.fieldErrors.label} />
        <Select label="Role" name="role" options={roleOptions} defaultValue="viewer" error={errors.fieldErrors.role} />
        <fieldset className="flex flex-col gap-2">
          <legend className="font-bold">The key acts for</legend>
          <label className="flex min-h-touch items-center gap-3">
            <input type="radio" name="boundTo" value="integration" checked={boundTo === 'integration'} onChange={() => setBoundTo('integration')} className="size-5" />
            A named integration
          </label>
          <label className="flex min-h-touch items-center gap-3">
            <input type="radio" name="boundTo" value="me" checked={boundTo === 'me'} onChange={() => setBoundTo('me')} className="size-5" />
            Me ({myName})
          </label>
        </fieldset>
        {boundTo === 'integration' && (
          <TextField label="Integration name" name="integrationName" hint="Shown in the audit log as who made each change." error={errors.fieldErrors.integrationName} />
        )}
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" loading={create.isPending}>
            Create key
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/** The owner's API keys: list with last use, create (secret shown once), revoke. */
export function ApiKeysScreen({ shopId, myName }: { shopId: string; myName: string }) {
  const keys = useApiKeys(shopId);
  const revoke = useRevokeApiKey(shopId);
  const toast = useToast();
  const [creating, setCreating] = useState(false);
  const [revoking, setRevoking] = useState<ApiKeySummary | null>(null);

  const columns = useMemo(
    () => [
      column.accessor('label', { header: 'Label', cell: (info) => <span className="font-bold">{info.getValue()}</span> }),
      column.accessor((k) => (k.role === 'buyer' ? 'Parts buyer' : 'Viewer'), { id: 'role', header: 'Role', cell: (info) => <Badge>{info.getValue()}</Badge> }),
      column.accessor((k) => k.integrationName ?? k.createdBy?.name ?? '', {
        id: 'actsFor',
        header: 'Acts for',
        cell: (info) => {
          const k = info.row.original;
          return k.integrationName ? `Integration “${k.integrationName}”` : (k.createdBy?.name ?? 'A former owner');
        },
      }),
      column.accessor('createdAt', { header: 'Created', cell: (info) => when(info.getValue()) }),
      column.accessor('lastUsedAt', { header: 'Last used', sortUndefined: 'last', cell: (info) => (info.getValue() ? when(info.getValue() as string) : <span className="text-ink-muted">Never</span>) }),
      column.accessor((k) => (k.revokedAt ? 'Revoked' : 'Active'), {
        id: 'status',
        header: 'Status',
        cell: (info) => (info.row.original.revokedAt ? <StatusPill status="na" label="Revoked" /> : <StatusPill status="ok" label="Active" />),
      }),
      column.display({
        id: 'actions',
        header: () => (
          <span className="relative">
            <span className="sr-only">Actions</span>
          </span>
        ),
        cell: (info) =>
          info.row.original.revokedAt ? null : (
            <Button variant="secondary" size="sm" aria-label={`Revoke “${info.row.original.label}”`} onClick={() => setRevoking(info.row.original)}>
              Revoke
            </Button>
          ),
      }),
    ],
    [],
  );

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-center justify-between gap-4">
        <p className="max-w-prose text-ink-muted">A key lets another program use Tappet’s API for this shop with the role you give it: at most a parts buyer.</p>
        <Button onClick={() => setCreating(true)}>Create an API key</Button>
      </div>
      {keys.isPending ? (
        <LoadingState label="Loading the API keys…" />
      ) : keys.isError ? (
        <ErrorState message={errorMessage(keys.error)} onRetry={() => void keys.refetch()} />
      ) : (
        <DataTable
          caption="API keys"
          columns={columns}
          data={keys.data}
          getRowId={(k) => k.id}
          initialSorting={[{ id: 'status', desc: false }]}
          empty={
            <EmptyState title="No API keys yet" action={<Button variant="secondary" onClick={() => setCreating(true)}>Create an API key</Button>}>
              Create one when an integration (a web shop, an accounting program) needs to read stock or place orders.
            </EmptyState>
          }
        />
      )}
      <div className="flex max-w-prose gap-3 rounded-md border-2 border-advise bg-advise-soft p-3 text-ink">
        <IconAdvise className="mt-0.5 shrink-0 text-advise" />
        <p>
          <span className="font-bold">Treat a key like a password.</span> Anyone holding an active key can act for the shop within its role. Revoke a key the
          moment it may have leaked.
        </p>
      </div>
      <CreateKeyDialog shopId={shopId} open={creating} onClose={() => setCreating(false)} myName={myName} />
      <ConfirmDialog
        open={revoking !== null}
        onCancel={() => {
          revoke.reset();
          setRevoking(null);
        }}
        title={`Revoke “${revoking?.label ?? ''}”?`}
        message={
          <div className="flex flex-col gap-2">
            <p>Every program using this key is refused from now on. This cannot be undone: create a new key if it is needed again. Its history stays in the audit log.</p>
            {revoke.isError && (
              <p role="alert" className="font-bold text-fail">
                {errorMessage(revoke.error)}
              </p>
            )}
          </div>
        }
        confirmLabel="Revoke key"
        destructive
        loading={revoke.isPending}
        onConfirm={() => {
          if (!revoking) return;
          const label = revoking.label;
          revoke.mutate(revoking.id, {
            onSuccess: () => {
              toast.show(`“${label}” is revoked.`, 'ok');
              setRevoking(null);
            },
          });
        }}
      />
    </div>
  );
}
