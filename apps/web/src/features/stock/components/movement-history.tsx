import { movementKinds, type Movement, type MovementKind } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, Num, PartNumber, Select, TextField } from '@tappet/ui';
import { useMemo, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useBins } from '../api/get-bins';
import { useMovements } from '../api/get-movements';
import { useValuation } from '../api/get-valuation';
import { BinWithCondition } from './bin-with-condition';
import { money, movementLabels, signed } from './words';
import { formatDate } from '../../../lib/dates';

const column = createColumnHelper<Movement>();
const PAGE_SIZE = 50;
const dateOnly = /^\d{4}-\d{2}-\d{2}$/;

/** The ledger, newest first, filtered by kind, bin, part and dates; pages of 50. */
export function MovementHistory({ shopId }: { shopId: string }) {
  const [params, setParams] = useSearchParams();
  const kind = (params.get('kind') ?? '') as MovementKind | '';
  const binId = params.get('binId') ?? '';
  const partId = params.get('partId') ?? '';
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  const page = Math.max(1, Number(params.get('page') ?? 1) || 1);
  const movements = useMovements(shopId, {
    kind: kind || undefined,
    binId: binId || undefined,
    partId: partId || undefined,
    from: dateOnly.test(from) ? from : undefined,
    to: dateOnly.test(to) ? to : undefined,
    page,
    pageSize: PAGE_SIZE,
  });
  const bins = useBins(shopId);
  const currency = useValuation(shopId).data?.currency ?? 'GBP';

  function onFilter(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const next = new URLSearchParams();
    if (partId) next.set('partId', partId);
    for (const key of ['kind', 'binId', 'from', 'to']) {
      const value = String(data.get(key) ?? '').trim();
      if (value) next.set(key, value);
    }
    setParams(next, { replace: true });
  }

  const goTo = (p: number) => {
    const next = new URLSearchParams(params);
    next.set('page', String(p));
    setParams(next);
  };

  const columns = useMemo(
    () => [
      column.accessor('occurredAt', { header: 'When', enableSorting: false, meta: { cellClassName: 'whitespace-nowrap' }, cell: (info) => formatDate(info.getValue()) }),
      // The detail (reason, reference, note, who) under what happened rather than in a column of
      // its own: the table then fits a tablet in landscape.
      column.accessor('kind', {
        header: 'What',
        enableSorting: false,
        cell: (info) => {
          const m = info.row.original;
          const detail = [m.serial && `No. ${m.serial}`, m.reason, m.reference, m.note, m.userName && `by ${m.userName}`].filter(Boolean).join(' · ');
          return (
            <>
              <span className="font-bold">{movementLabels[info.getValue()]}</span>
              {detail && <span className="block min-w-28 text-sm text-ink-muted">{detail}</span>}
            </>
          );
        },
      }),
      column.accessor('partNumber', {
        header: 'Part',
        enableSorting: false,
        cell: (info) => (
          <Link to={paths.shop.part.getHref(shopId, info.row.original.partId)} className="text-accent underline-offset-4 hover:underline">
            <PartNumber>{info.getValue()}</PartNumber>
          </Link>
        ),
      }),
      // Condition under the bin: the table fits a tablet in landscape with room for the detail.
      column.accessor('binCode', {
        header: 'Bin and condition',
        enableSorting: false,
        cell: (info) => <BinWithCondition code={info.getValue()} condition={info.row.original.condition} to={info.row.original.toBinCode} />,
      }),
      column.accessor('quantityDelta', {
        header: 'Qty',
        enableSorting: false,
        meta: { numeric: true },
        cell: (info) => <Num>{info.row.original.kind === 'moved' ? String(-info.getValue()) : info.row.original.kind === 'counted' ? `${info.row.original.countedQuantity ?? ''} (${signed(info.getValue())})` : signed(info.getValue())}</Num>,
      }),
      column.accessor('valueChangeMinor', { header: 'Value', enableSorting: false, meta: { numeric: true, cellClassName: 'whitespace-nowrap' }, cell: (info) => <Num>{money(info.getValue(), currency)}</Num> }),
    ],
    [shopId, currency],
  );

  const total = movements.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  return (
    <>
      <form role="search" aria-label="Filter movements" onSubmit={onFilter} className="mb-4 grid grid-cols-1 items-end gap-3 sm:grid-cols-2 lg:grid-cols-[repeat(4,minmax(0,1fr))_auto]">
        <Select label="Kind" name="kind" options={movementKinds.map((k) => ({ value: k, label: movementLabels[k] }))} placeholder="Every kind" defaultValue={kind} />
        <Select label="Bin" name="binId" options={(bins.data?.bins ?? []).map((b) => ({ value: b.id, label: b.code }))} placeholder="Every bin" defaultValue={binId} />
        <TextField label="From" name="from" type="date" defaultValue={from} />
        <TextField label="To" name="to" type="date" defaultValue={to} />
        <Button type="submit">Show</Button>
      </form>
      {partId && (
        <p className="mb-3">
          One part only.{' '}
          <Link to={paths.shop.stockMovements.getHref(shopId)} className="text-accent underline underline-offset-4">
            Show every part
          </Link>
        </p>
      )}
      {movements.isPending ? (
        <LoadingState label="Loading movements…" />
      ) : movements.isError ? (
        <ErrorState message={errorMessage(movements.error)} onRetry={() => void movements.refetch()} />
      ) : movements.data.movements.length === 0 ? (
        <EmptyState title="No movements match">Change the filters, or receive stock to start the ledger.</EmptyState>
      ) : (
        <>
          <DataTable caption="Stock movements, newest first" columns={columns} data={movements.data.movements} pageSize={PAGE_SIZE} getRowId={(m) => m.id} />
          <div className="mt-3 flex items-center gap-3">
            <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => goTo(page - 1)}>
              Newer
            </Button>
            <span className="text-ink-muted">
              Page <Num>{page}</Num> of <Num>{pages}</Num> · <Num>{total}</Num> movements
            </span>
            <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => goTo(page + 1)}>
              Older
            </Button>
          </div>
        </>
      )}
    </>
  );
}
