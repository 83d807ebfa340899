import type { StockCondition, StockLine } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, MenuButton, Num, PageNav, PartNumber, Select, TextField } from '@tappet/ui';
import { useMemo, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useBins } from '../api/get-bins';
import { useStock } from '../api/get-stock';
import { useValuation } from '../api/get-valuation';
import { StockActionDialog, type StockAction, type StockActionPreset } from './stock-action-dialog';
import { BinWithCondition } from './bin-with-condition';
import { conditionOptions } from './words';

const column = createColumnHelper<StockLine>();
/** Lines a page; the API pages the list (by part number, bin, then condition). */
const PAGE = 50;

/** Stock per part and per bin: filter by number, bin or condition; act on a line with the keyboard or a tap. */
export function StockLines({ shopId }: { shopId: string }) {
  const [params, setParams] = useSearchParams();
  const q = params.get('q') ?? '';
  const binId = params.get('binId') ?? '';
  const condition = (params.get('condition') ?? '') as StockCondition | '';
  const page = Math.max(1, Number(params.get('page') ?? 1) || 1);
  const stock = useStock(shopId, { q: q || undefined, binId: binId || undefined, condition: condition || undefined, page, pageSize: PAGE });
  const bins = useBins(shopId);
  const currency = useValuation(shopId).data?.currency ?? 'GBP';
  const [dialog, setDialog] = useState<{ action: StockAction; preset?: StockActionPreset } | null>(null);
  const can = {
    receive: useCan('receive', 'Stock', { shopId }),
    issue: useCan('issue', 'Stock', { shopId }),
    hold: useCan('hold', 'Stock', { shopId }),
    move: useCan('move', 'Stock', { shopId }),
    adjust: useCan('adjust', 'Stock', { shopId }),
    count: useCan('count', 'Stock', { shopId }),
  };

  function onFilter(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const next = new URLSearchParams();
    for (const key of ['q', 'binId', 'condition']) {
      const value = String(data.get(key) ?? '').trim();
      if (value) next.set(key, value);
    }
    setParams(next, { replace: true });
  }

  const goTo = (p: number) => {
    const next = new URLSearchParams(params);
    if (p > 1) next.set('page', String(p));
    else next.delete('page');
    setParams(next);
  };

  const columns = useMemo(() => {
    const act = (line: StockLine, action: StockAction, label: string) => (
      <Button
        size="sm"
        variant="secondary"
        aria-label={`${label} ${line.partNumber} from ${line.binCode}`}
        onClick={() => setDialog({ action, preset: { partId: line.partId, partNumber: line.partNumber, binId: line.binId, condition: line.condition } })}
      >
        {label}
      </Button>
    );
    return [
      // Number with its description beneath, and bin with its condition beneath: the row's
      // actions then fit beside the figures on a tablet in landscape.
      column.accessor('partNumber', {
        enableSorting: false,
        header: 'Part',
        cell: (info) => (
          <>
            <Link to={paths.shop.part.getHref(shopId, info.row.original.partId)} className="text-accent underline-offset-4 hover:underline">
              <PartNumber>{info.getValue()}</PartNumber>
            </Link>
            <span className="block text-sm text-ink-muted">{info.row.original.partDescription}</span>
          </>
        ),
      }),
      column.accessor('binCode', {
        enableSorting: false,
        header: 'Bin and condition',
        cell: (info) => <BinWithCondition code={info.getValue()} condition={info.row.original.condition} />,
      }),
      column.accessor('onHand', { enableSorting: false, header: 'On hand', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('held', { enableSorting: false, header: 'Held', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('free', { enableSorting: false, header: 'Free', meta: { numeric: true }, cell: (info) => <Num className="font-bold">{info.getValue()}</Num> }),
      column.display({
        id: 'actions',
        header: 'Actions',
        cell: (info) => {
          const line = info.row.original;
          const open = (action: StockAction) => () => setDialog({ action, preset: { partId: line.partId, partNumber: line.partNumber, binId: line.binId, condition: line.condition } });
          const where = `${line.partNumber} from ${line.binCode}`;
          // The everyday two as buttons; the rest in a menu, so a row stays one line high on a tablet.
          const more = [
            ...(can.move && line.free > 0 ? [{ key: 'move', label: `Move ${where}`, onSelect: open('move') }] : []),
            ...(can.adjust ? [{ key: 'adjust', label: `Adjust ${where}`, onSelect: open('adjust') }] : []),
            ...(can.count ? [{ key: 'count', label: `Count ${where}`, onSelect: open('count') }] : []),
          ];
          return (
            <div className="flex flex-nowrap gap-1">
              {can.issue && line.free > 0 && act(line, 'issue', 'Issue')}
              {can.hold && line.free > 0 && act(line, 'hold', 'Hold')}
              {more.length > 0 && <MenuButton label="More" variant="secondary" align="end" items={more} />}
            </div>
          );
        },
      }),
    ];
  }, [shopId, can.issue, can.hold, can.move, can.adjust, can.count]);

  const binOptions = (bins.data?.bins ?? []).map((b) => ({ value: b.id, label: b.code }));

  return (
    <>
      <form role="search" aria-label="Filter stock" onSubmit={onFilter} className="mb-4 grid grid-cols-1 items-end gap-3 sm:grid-cols-3 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)_auto]">
        <TextField label="Part number or words" name="q" defaultValue={q} autoComplete="off" className="font-mono" />
        <Select label="Bin" name="binId" options={binOptions} placeholder="Every bin" defaultValue={binId} />
        <Select label="Condition" name="condition" options={conditionOptions} placeholder="Every condition" defaultValue={condition} />
        <div className="flex gap-2 sm:col-span-3 xl:col-span-1">
          <Button type="submit">Show</Button>
          {can.receive && (
            <Button variant="secondary" onClick={() => setDialog({ action: 'receive' })}>
              Receive stock
            </Button>
          )}
        </div>
      </form>
      {stock.isPending ? (
        <LoadingState label="Loading stock…" />
      ) : stock.isError ? (
        <ErrorState message={errorMessage(stock.error)} onRetry={() => void stock.refetch()} />
      ) : stock.data.lines.length === 0 && stock.data.total > 0 ? (
        // Past the last page: an old link, or its last line was just issued.
        <EmptyState title="No stock lines on this page" action={<Button variant="secondary" onClick={() => goTo(1)}>Show the first page</Button>}>
          {stock.data.total} {stock.data.total === 1 ? 'line matches' : 'lines match'} in all.
        </EmptyState>
      ) : stock.data.lines.length === 0 ? (
        <EmptyState title={q || binId || condition ? 'Nothing on hand matches' : 'No stock yet'}>{can.receive ? 'Receive stock into a bin to see it here.' : 'Stock appears here once it is received.'}</EmptyState>
      ) : (
        <div className="flex flex-col gap-3" aria-busy={stock.isPlaceholderData || undefined}>
          {/* The API pages and orders this list; the table's own row count would count one page only. */}
          <DataTable caption="Stock per part, bin and condition" columns={columns} data={stock.data.lines} pageSize={PAGE} getRowId={(l) => `${l.partId}|${l.binId}|${l.condition}`} className="[&>div:last-child]:hidden" />
          <PageNav label="Pages of stock lines" noun="Lines" page={stock.data.page} pageSize={stock.data.pageSize} total={stock.data.total} onPage={goTo} />
        </div>
      )}
      <StockActionDialog shopId={shopId} action={dialog?.action ?? null} preset={dialog?.preset} currency={currency} onClose={() => setDialog(null)} />
    </>
  );
}
