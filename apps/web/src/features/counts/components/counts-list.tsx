import type { CountSummary } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, Num, PartNumber } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useCounts } from '../api/get-counts';
import { countStatusWords } from './count-words';
import { StartCountDialog } from './start-count-dialog';
import { formatDate } from '../../../lib/dates';

const column = createColumnHelper<CountSummary>();
/** What a count covers, in words. */
export function scopeWords(count: Pick<CountSummary, 'scope'>): string {
  if (count.scope.categories.length > 0) return `${count.scope.categories.length === 1 ? 'Category' : 'Categories'} ${count.scope.categories.join(', ')}`;
  const codes = count.scope.bins.map((b) => b.code);
  return `${codes.length === 1 ? 'Bin' : 'Bins'} ${codes.slice(0, 6).join(', ')}${codes.length > 6 ? ` and ${codes.length - 6} more` : ''}`;
}

/** Every count of the shop, newest first; owners and buyers start new ones. */
export function CountsList({ shopId }: { shopId: string }) {
  const counts = useCounts(shopId);
  const canStart = useCan('create', 'StockCount', { shopId });
  const [starting, setStarting] = useState(false);

  const columns = useMemo(
    () => [
      column.accessor('number', {
        header: 'Count',
        cell: (info) => (
          <Link to={paths.shop.count.getHref(shopId, info.row.original.id)} className="font-bold text-accent underline-offset-4 hover:underline">
            Count <PartNumber>{info.getValue()}</PartNumber>
          </Link>
        ),
      }),
      column.accessor('status', { header: 'Status', cell: (info) => <span className={info.getValue() === 'open' ? 'font-bold' : ''}>{countStatusWords[info.getValue()]}</span> }),
      column.display({ id: 'scope', header: 'Covers', cell: (info) => scopeWords(info.row.original) }),
      column.display({
        id: 'progress',
        header: 'Counted',
        meta: { numeric: true },
        cell: (info) => (
          <Num>
            {info.row.original.countedCount} of {info.row.original.lineCount}
          </Num>
        ),
      }),
      column.accessor('differenceCount', { header: 'Differences', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.display({ id: 'started', header: 'Started', cell: (info) => `${formatDate(info.row.original.started.at)}${info.row.original.started.name ? `, ${info.row.original.started.name}` : ''}` }),
    ],
    [shopId],
  );

  if (counts.isPending) return <LoadingState label="Loading counts…" />;
  if (counts.isError) return <ErrorState message={errorMessage(counts.error)} onRetry={() => void counts.refetch()} />;
  return (
    <>
      {canStart && (
        <div className="mb-4">
          <Button onClick={() => setStarting(true)}>Start a count</Button>
        </div>
      )}
      {counts.data.counts.length === 0 ? (
        <EmptyState title="No counts yet">{canStart ? 'Start a count of a few bins or a category: what the ledger says is frozen, then people count what is on the shelves.' : 'An owner or buyer starts counts; you can then enter what you count.'}</EmptyState>
      ) : (
        <DataTable caption="Stock counts" columns={columns} data={counts.data.counts} getRowId={(c) => c.id} />
      )}
      <StartCountDialog shopId={shopId} open={starting} onClose={() => setStarting(false)} />
    </>
  );
}
