import { binInputSchema, binUpdateSchema, type Bin } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormDialogFooter, FormMessage, LoadingState, Num, PartNumber, TextField, useToast } from '@tappet/ui';
import { useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useBins } from '../api/get-bins';
import { createBin, updateBin, useStockMutation } from '../api/write-stock';

const column = createColumnHelper<Bin>();
const fields = ['code', 'description'] as const;

/** Adds a bin or changes one (code, description, in use). */
function BinDialog({ shopId, bin, onClose }: { shopId: string; bin: Bin | null | 'new'; onClose: () => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const errors = useFormErrors(formRef);
  const toast = useToast();
  const create = useStockMutation(shopId, createBin);
  const update = useStockMutation(shopId, (s: string, input: { id: string; patch: Parameters<typeof updateBin>[2] }) => updateBin(s, input.id, input.patch));
  if (bin === null) return null;
  const existing = bin === 'new' ? null : bin;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const v = formValues(event.currentTarget);
    const body = { code: v.code ?? '', description: v.description ?? '', ...(existing ? { active: v.active === 'on' } : {}) };
    const parsed = existing ? binUpdateSchema.safeParse(body) : binInputSchema.safeParse(body);
    if (!parsed.success) return errors.failValidation(parsed.error);
    errors.clear();
    const done = {
      onSuccess: () => {
        toast.show(existing ? `Bin ${body.code} saved.` : `Bin ${body.code} added.`, 'ok');
        onClose();
      },
      onError: (error: unknown) => errors.failApi(error, fields),
    };
    if (existing) update.mutate({ id: existing.id, patch: parsed.data }, done);
    else create.mutate(parsed.data as { code: string; description: string | null }, done);
  }

  return (
    <Dialog
      open
      onClose={onClose}
      title={existing ? `Bin ${existing.code}` : 'Add a bin'}
      description="A code people can read off the shelf label, and where to find it."
      footer={<FormDialogFooter formId={formId} submitLabel={existing ? 'Save bin' : 'Add bin'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Code" name="code" defaultValue={existing?.code ?? ''} hint="e.g. B-04" error={errors.fieldErrors.code} className="font-mono" autoComplete="off" />
        <TextField label="Description" name="description" defaultValue={existing?.description ?? ''} hint="Optional: aisle, shelf, bin." error={errors.fieldErrors.description} autoComplete="off" />
        {existing && (
          <label className="flex min-h-touch items-center gap-3">
            <input type="checkbox" name="active" defaultChecked={existing.active} className="h-5 w-5 accent-accent" />
            In use (a bin holding stock stays in use)
          </label>
        )}
      </form>
    </Dialog>
  );
}

/** Every bin with what it holds; owners and buyers add and change bins. */
export function BinsList({ shopId }: { shopId: string }) {
  const bins = useBins(shopId);
  const canCreate = useCan('create', 'Bin', { shopId });
  const canUpdate = useCan('update', 'Bin', { shopId });
  const [editing, setEditing] = useState<Bin | null | 'new'>(null);

  const columns = useMemo(
    () => [
      column.accessor('code', {
        header: 'Code',
        cell: (info) => (
          <Link to={paths.shop.stock.getHref(shopId, `binId=${info.row.original.id}`)} className="text-accent underline-offset-4 hover:underline">
            <PartNumber>{info.getValue()}</PartNumber>
          </Link>
        ),
      }),
      column.accessor('description', { header: 'Description', cell: (info) => info.getValue() ?? '—' }),
      column.accessor('lineCount', { header: 'Lines', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('onHand', { header: 'Units', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('active', { header: 'In use', cell: (info) => (info.getValue() ? 'Yes' : 'No') }),
      ...(canUpdate
        ? [
            column.display({
              id: 'edit',
              header: 'Actions',
              cell: (info) => (
                <Button size="sm" variant="secondary" aria-label={`Edit bin ${info.row.original.code}`} onClick={() => setEditing(info.row.original)}>
                  Edit
                </Button>
              ),
            }),
          ]
        : []),
    ],
    [shopId, canUpdate],
  );

  if (bins.isPending) return <LoadingState label="Loading bins…" />;
  if (bins.isError) return <ErrorState message={errorMessage(bins.error)} onRetry={() => void bins.refetch()} />;
  return (
    <>
      {canCreate && (
        <div className="mb-4">
          <Button onClick={() => setEditing('new')}>Add a bin</Button>
        </div>
      )}
      {bins.data.bins.length === 0 ? (
        <EmptyState title="No bins yet">{canCreate ? 'Add the shelves and bins of the store room, then receive stock into them.' : 'An owner or buyer adds the bins.'}</EmptyState>
      ) : (
        <DataTable caption="Bins" columns={columns} data={bins.data.bins} filterLabel="Filter bins" getRowId={(b) => b.id} />
      )}
      <BinDialog shopId={shopId} bin={editing} onClose={() => setEditing(null)} />
    </>
  );
}
