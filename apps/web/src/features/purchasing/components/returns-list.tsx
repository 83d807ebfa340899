import type { SupplierReturn } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormDialogFooter, LoadingState, Num, PartNumber, StatusPill, TextField } from '@tappet/ui';
import { parseMinorUnits } from '@tappet/domain';
import { useId, useMemo, useState, type FormEvent } from 'react';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useReturns } from '../api/get-returns';
import { creditReturn } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { money } from './words';

const column = createColumnHelper<SupplierReturn>();
const kindWords: Record<SupplierReturn['kind'], string> = { return: 'Return', core: 'Core' };

/** Records the credit a supplier gave for a return or core. */
function CreditDialog({ shopId, item, onClose }: { shopId: string; item: SupplierReturn; onClose: () => void }) {
  const formId = useId();
  const credit = usePurchasingMutation(shopId, creditReturn);
  const [error, setError] = useState<string | null>(null);
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    let creditedMinor: number;
    try {
      creditedMinor = parseMinorUnits(String(form.get('amount') ?? ''));
    } catch {
      return setError(`Write the amount in ${item.currency} like 12.50.`);
    }
    const reference = String(form.get('reference') ?? '').trim();
    credit.mutate({ returnId: item.id, creditedMinor, creditReference: reference || null }, { onSuccess: onClose, onError: (e) => setError(errorMessage(e)) });
  }
  return (
    <Dialog open onClose={onClose} title={`Credit for ${item.partNumber}`} description={`Expected ${money(item.expectedCreditMinor, item.currency)} from ${item.supplierName}.`} footer={<FormDialogFooter formId={formId} submitLabel="Record credit" loading={credit.isPending} onCancel={onClose} />}>
      <form id={formId} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        <TextField label={`Amount credited (${item.currency})`} name="amount" inputMode="decimal" defaultValue={(item.expectedCreditMinor / 100).toFixed(2)} error={error ?? undefined} />
        <TextField label="Credit note reference (optional)" name="reference" autoComplete="off" />
      </form>
    </Dialog>
  );
}

/** Returns to suppliers and cores sent back, open until the supplier credits them. */
export function ReturnsList({ shopId }: { shopId: string }) {
  const returns = useReturns(shopId);
  const canUpdate = useCan('update', 'PurchaseOrder', { shopId });
  const [crediting, setCrediting] = useState<SupplierReturn | null>(null);
  const columns = useMemo(
    () => [
      // The kind under the date: the table fits a tablet in landscape.
      column.accessor((row) => `${row.createdAt.slice(0, 10)} ${kindWords[row.kind]}`, {
        id: 'date',
        header: 'Date',
        cell: (info) => (
          <>
            <span className="whitespace-nowrap">{info.row.original.createdAt.slice(0, 10)}</span>
            <span className="block text-sm text-ink-muted">{kindWords[info.row.original.kind]}</span>
          </>
        ),
      }),
      column.accessor('partNumber', { header: 'Part', cell: (info) => <PartNumber>{info.getValue()}</PartNumber> }),
      column.accessor('quantity', { header: 'Qty', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('supplierName', { header: 'Supplier' }),
      column.accessor('reason', { header: 'Reason' }),
      column.accessor('expectedCreditMinor', { header: 'Credit due', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('status', {
        header: 'State',
        cell: (info) =>
          info.getValue() === 'credited' ? (
            <StatusPill status="ok" label={`Credited ${money(info.row.original.creditedMinor, info.row.original.currency)}`} />
          ) : canUpdate ? (
            <Button size="sm" variant="secondary" aria-label={`Record credit for ${info.row.original.partNumber}`} onClick={() => setCrediting(info.row.original)}>
              Record credit
            </Button>
          ) : (
            <StatusPill status="advise" label="Awaiting credit" />
          ),
      }),
    ],
    [canUpdate],
  );
  if (returns.isPending) return <LoadingState label="Loading returns…" />;
  if (returns.isError) return <ErrorState message={errorMessage(returns.error)} onRetry={() => void returns.refetch()} />;
  return (
    <>
      {returns.data.returns.length === 0 ? (
        <EmptyState title="No returns">Faulty or wrong parts sent back, and cores returned for their deposit, are tracked here until credited.</EmptyState>
      ) : (
        <DataTable caption="Returns and cores" columns={columns} data={returns.data.returns} filterLabel="Filter returns" getRowId={(r) => r.id} />
      )}
      {crediting && <CreditDialog shopId={shopId} item={crediting} onClose={() => setCrediting(null)} />}
    </>
  );
}
