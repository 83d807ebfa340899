import { supplierInputSchema, type ListingImportResult, type Supplier } from '@tappet/contracts';
import { minorUnitExponent } from '@tappet/domain';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormDialogFooter, FormMessage, LoadingState, Num, TextField, useToast } from '@tappet/ui';
import { parseMinorUnits } from '@tappet/domain';
import { useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useSuppliers } from '../api/get-suppliers';
import { createSupplier, importListings, updateSupplier } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { money } from './words';

const column = createColumnHelper<Supplier>();
const fields = ['name', 'email', 'currency', 'leadTimeDays', 'leadTimeSdDays', 'minOrderValueMinor', 'notes'] as const;

/** Adds a supplier, or changes one: contact e-mail, currency, lead time and its spread, minimum order value. */
export function SupplierDialog({ shopId, supplier, onClose }: { shopId: string; supplier?: Supplier; onClose: () => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const errors = useFormErrors(formRef);
  const create = usePurchasingMutation(shopId, createSupplier);
  const update = usePurchasingMutation(shopId, updateSupplier);
  const toast = useToast();
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const v = formValues(event.currentTarget);
    const currency = (v.currency ?? '').trim().toUpperCase();
    let minOrderValueMinor: number | undefined;
    try {
      minOrderValueMinor = v.minOrderValue ? parseMinorUnits(v.minOrderValue, minorUnitExponent(/^[A-Z]{3}$/.test(currency) ? currency : 'GBP')) : 0;
    } catch {
      minOrderValueMinor = Number.NaN;
    }
    const body = {
      name: v.name ?? '',
      email: v.email ? v.email : null,
      currency,
      leadTimeDays: v.leadTimeDays === '' || v.leadTimeDays === undefined ? Number.NaN : Number(v.leadTimeDays),
      leadTimeSdDays: v.leadTimeSdDays ? Number(v.leadTimeSdDays) : null,
      minOrderValueMinor,
      notes: v.notes ? v.notes : null,
    };
    const parsed = supplierInputSchema.safeParse(body);
    if (!parsed.success) return errors.failValidation(parsed.error);
    errors.clear();
    const done = {
      onSuccess: (s: Supplier) => {
        toast.show(supplier ? `${s.name} saved.` : `${s.name} added.`, 'ok');
        onClose();
      },
      onError: (error: unknown) => errors.failApi(error, fields),
    };
    if (supplier) update.mutate({ supplierId: supplier.id, body: parsed.data }, done);
    else create.mutate(parsed.data, done);
  }
  const exp = supplier ? minorUnitExponent(supplier.currency) : 2;
  return (
    <Dialog
      open
      onClose={onClose}
      title={supplier ? `Change ${supplier.name}` : 'Add a supplier'}
      description="Orders go to the e-mail address as a PDF."
      footer={<FormDialogFooter formId={formId} submitLabel={supplier ? 'Save supplier' : 'Add supplier'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Name" name="name" defaultValue={supplier?.name} error={errors.fieldErrors.name} autoComplete="off" />
        <TextField label="Order e-mail" name="email" type="email" defaultValue={supplier?.email ?? ''} error={errors.fieldErrors.email} autoComplete="off" />
        <TextField label="Currency" name="currency" defaultValue={supplier?.currency ?? 'GBP'} hint="Three letters, e.g. GBP or EUR." error={errors.fieldErrors.currency} autoComplete="off" className="font-mono" />
        <TextField label="Lead time (days)" name="leadTimeDays" inputMode="numeric" defaultValue={String(supplier?.leadTimeDays ?? 7)} error={errors.fieldErrors.leadTimeDays} />
        <TextField
          label="Lead time spread (days, optional)"
          name="leadTimeSdDays"
          inputMode="decimal"
          defaultValue={supplier?.leadTimeSdDays === null || supplier?.leadTimeSdDays === undefined ? '' : String(supplier.leadTimeSdDays)}
          hint="Standard deviation, if you know it."
          error={errors.fieldErrors.leadTimeSdDays}
        />
        <TextField
          label="Minimum order value"
          name="minOrderValue"
          inputMode="decimal"
          defaultValue={supplier ? (supplier.minOrderValueMinor / 10 ** exp).toFixed(exp) : ''}
          hint="In the supplier's currency, e.g. 150.00."
          error={errors.fieldErrors.minOrderValueMinor}
        />
        <TextField label="Notes (optional)" name="notes" defaultValue={supplier?.notes ?? ''} error={errors.fieldErrors.notes} autoComplete="off" />
      </form>
    </Dialog>
  );
}

/** Uploads a listings CSV: preview first, then import all rows or none. */
function ImportListings({ shopId }: { shopId: string }) {
  const [file, setFile] = useState<File | null>(null);
  const [result, setResult] = useState<ListingImportResult | null>(null);
  const run = usePurchasingMutation(shopId, importListings);
  const [error, setError] = useState<string | null>(null);
  const go = (mode: 'preview' | 'commit') => {
    if (!file) return setError('Choose a CSV file first.');
    setError(null);
    run.mutate({ mode, file }, { onSuccess: setResult, onError: (e) => setError(errorMessage(e)) });
  };
  return (
    <section className="mt-8 max-w-3xl">
      <h2 className="mb-2 text-lg font-bold">Import listings from CSV</h2>
      <p className="mb-2 text-ink-muted">
        Columns: <code>supplier, part_number, price</code>, and optionally <code>supplier_number, pack_size, min_order_qty, lead_time_days</code>. Nothing is written unless every row is good.
      </p>
      <label className="mb-2 flex flex-col gap-1 font-bold">
        CSV file
        <input type="file" accept=".csv,text/csv" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="min-h-touch" />
      </label>
      <div className="flex gap-2">
        <Button variant="secondary" onClick={() => go('preview')} loading={run.isPending}>
          Preview
        </Button>
        <Button onClick={() => go('commit')} disabled={!result || result.errors.length > 0 || result.committed} loading={run.isPending}>
          Import
        </Button>
      </div>
      {error && <FormMessage>{error}</FormMessage>}
      {result && (
        <div className="mt-3" role="status">
          <p>
            {result.rows} rows: {result.added} to add, {result.changed} to change, {result.unchanged} the same.{result.committed ? ' Imported.' : ''}
          </p>
          {result.errors.length > 0 && (
            <ul className="mt-2 list-disc pl-6 text-fail">
              {result.errors.map((e) => (
                <li key={`${e.row}-${e.column}`}>
                  Row {e.row}
                  {e.column ? `, ${e.column}` : ''}: {e.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}

/** The shop's suppliers; owners and buyers add them and import listings. */
export function SuppliersList({ shopId }: { shopId: string }) {
  const suppliers = useSuppliers(shopId);
  const canCreate = useCan('create', 'Supplier', { shopId });
  const canImport = useCan('import', 'Supplier', { shopId });
  const [adding, setAdding] = useState(false);
  const columns = useMemo(
    () => [
      // The order e-mail under the name: the table fits a tablet in landscape.
      column.accessor((row) => `${row.name} ${row.email ?? ''}`, {
        id: 'name',
        header: 'Supplier',
        cell: (info) => (
          <>
            <Link to={paths.shop.purchasingSupplier.getHref(shopId, info.row.original.id)} className="font-bold text-accent">
              {info.row.original.name}
            </Link>
            <span className="block text-sm break-all text-ink-muted">{info.row.original.email ?? 'No order e-mail'}</span>
          </>
        ),
      }),
      column.accessor('currency', { header: 'Currency', cell: (info) => <span className="font-mono">{info.getValue()}</span> }),
      column.accessor('leadTimeDays', { header: 'Lead time', meta: { numeric: true, cellClassName: 'whitespace-nowrap' }, cell: (info) => <Num>{`${info.getValue()} d${info.row.original.leadTimeSdDays ? ` ± ${info.row.original.leadTimeSdDays}` : ''}`}</Num> }),
      column.accessor('minOrderValueMinor', { header: 'Minimum order', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('listingCount', { header: 'Listings', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('openOrderCount', { header: 'Open orders', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
    ],
    [shopId],
  );
  if (suppliers.isPending) return <LoadingState label="Loading suppliers…" />;
  if (suppliers.isError) return <ErrorState message={errorMessage(suppliers.error)} onRetry={() => void suppliers.refetch()} />;
  return (
    <>
      {canCreate && (
        <div className="mb-4">
          <Button onClick={() => setAdding(true)}>Add a supplier</Button>
        </div>
      )}
      {suppliers.data.suppliers.length === 0 ? (
        <EmptyState title="No suppliers yet">{canCreate ? 'Add the suppliers you buy from, then import their price lists.' : 'An owner or buyer adds suppliers.'}</EmptyState>
      ) : (
        <DataTable caption="Suppliers" columns={columns} data={suppliers.data.suppliers} filterLabel="Filter suppliers" getRowId={(s) => s.id} />
      )}
      {canImport && <ImportListings shopId={shopId} />}
      {adding && <SupplierDialog shopId={shopId} onClose={() => setAdding(false)} />}
    </>
  );
}
