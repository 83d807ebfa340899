import type { VarianceLine } from '@tappet/contracts';
import { Button, cn, ConfirmDialog, createColumnHelper, DataTable, EmptyState, ErrorState, FormMessage, LoadingState, Num, PartNumber, useToast } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useFormatMoney } from '../../../lib/shop-settings';
import { useCount } from '../api/get-count';
import { useVariances } from '../api/get-variances';
import { abandonCount, postCount, useCountMutation } from '../api/write-counts';
import { conditionWords, countStatusWords, signed } from './count-words';

const column = createColumnHelper<VarianceLine>();

/** A difference with its word, so it is not told by colour alone. */
function Difference({ n, children }: { n: number; children: React.ReactNode }) {
  if (n === 0) return <span className="text-ink-muted">{children}</span>;
  return <span className={cn('font-bold', n < 0 ? 'text-fail' : 'text-ok')}>{children}</span>;
}

/**
 * The variance report of a count: each counted line's expected and counted quantity and the
 * difference in quantity and value (moving-average cost; once posted, what the ledger moved),
 * differences first. The owner posts it; an owner or buyer abandons it; both ask first.
 */
export function VarianceReport({ shopId, countId }: { shopId: string; countId: string }) {
  const report = useVariances(shopId, countId);
  const count = useCount(shopId, countId);
  const money = useFormatMoney(shopId);
  const canPost = useCan('approve', 'StockCount', { shopId });
  const canAbandon = useCan('update', 'StockCount', { shopId });
  const post = useCountMutation(shopId, postCount);
  const abandon = useCountMutation(shopId, abandonCount);
  const toast = useToast();
  const [confirm, setConfirm] = useState<'post' | 'abandon' | null>(null);

  const columns = useMemo(
    () => [
      column.accessor('binCode', { header: 'Bin', cell: (info) => <PartNumber>{info.getValue()}</PartNumber> }),
      column.accessor('partNumber', {
        header: 'Part',
        cell: (info) => (
          <span>
            <PartNumber>{info.getValue()}</PartNumber>
            <span className="block text-sm text-ink-muted">
              {info.row.original.partDescription} · {conditionWords[info.row.original.condition]}
              {info.row.original.serialised ? ' · by serial number' : ''}
            </span>
          </span>
        ),
      }),
      column.accessor('expectedQuantity', { header: 'Expected', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('countedQuantity', { header: 'Counted', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('variance', {
        header: 'Difference',
        meta: { numeric: true },
        cell: (info) => (
          <Difference n={info.getValue()}>
            <Num>{signed(info.getValue())}</Num>
            {info.getValue() !== 0 && <span className="sr-only">{info.getValue() < 0 ? ' short' : ' over'}</span>}
          </Difference>
        ),
      }),
      column.accessor('valueDifferenceMinor', {
        header: 'Value',
        meta: { numeric: true },
        cell: (info) => {
          const v = info.getValue();
          if (v === null) return <span className="text-ink-muted">no cost</span>;
          return (
            <Difference n={v}>
              <Num>{v > 0 ? `+${money(v)}` : v < 0 ? `−${money(-v)}` : money(0)}</Num>
            </Difference>
          );
        },
      }),
    ],
    [money],
  );

  if (report.isPending || count.isPending) return <LoadingState label="Loading the differences…" />;
  if (report.isError) return <ErrorState message={errorMessage(report.error)} onRetry={() => void report.refetch()} />;
  if (count.isError) return <ErrorState message={errorMessage(count.error)} onRetry={() => void count.refetch()} />;
  const data = report.data;
  const open = data.status === 'open';
  const t = data.totals;
  const differing = data.lines.filter((l) => l.variance !== 0).length;
  const error = post.error ?? abandon.error;

  return (
    <div className="flex flex-col gap-6">
      <p>
        <span className="font-bold">{countStatusWords[data.status]}</span>
        {count.data.closed ? ` on ${new Date(count.data.closed.at).toLocaleString()}${count.data.closed.name ? ` by ${count.data.closed.name}` : ''}` : ''}.{' '}
        <Link to={paths.shop.count.getHref(shopId, countId)} className="text-accent underline-offset-4 hover:underline">
          {open ? 'Back to counting' : 'The count, line by line'}
        </Link>
      </p>

      <dl className="grid max-w-2xl grid-cols-2 gap-3 sm:grid-cols-4">
        <div className="rounded-md border border-line p-3">
          <dt className="text-sm text-ink-muted">Lines differing</dt>
          <dd className="text-lg font-bold">
            <Num>{differing}</Num>
          </dd>
        </div>
        <div className="rounded-md border border-line p-3">
          <dt className="text-sm text-ink-muted">Over (units)</dt>
          <dd className="text-lg font-bold">
            <Num>{signed(t.over)}</Num> <span className="block text-sm font-normal">{money(t.valueOverMinor)}</span>
          </dd>
        </div>
        <div className="rounded-md border border-line p-3">
          <dt className="text-sm text-ink-muted">Short (units)</dt>
          <dd className="text-lg font-bold">
            <Num>{signed(-t.short)}</Num> <span className="block text-sm font-normal">{money(t.valueShortMinor)}</span>
          </dd>
        </div>
        <div className="rounded-md border border-line p-3">
          <dt className="text-sm text-ink-muted">{data.postedValueMinor === null ? 'Net value if posted' : 'Net value posted'}</dt>
          <dd className="text-lg font-bold">
            <Num>{(data.postedValueMinor ?? t.netValueMinor) < 0 ? `−${money(-(data.postedValueMinor ?? t.netValueMinor))}` : money(data.postedValueMinor ?? t.netValueMinor)}</Num>
          </dd>
        </div>
      </dl>
      {data.uncountedCount > 0 && (
        <p>
          <Num>{data.uncountedCount}</Num> {data.uncountedCount === 1 ? 'line is' : 'lines are'} not counted yet{open ? ': posting leaves them as they are.' : '.'}
        </p>
      )}
      {error && <FormMessage>{errorMessage(error)}</FormMessage>}

      {open && (canPost || canAbandon) && (
        <div className="flex flex-wrap gap-2">
          {canPost && (
            <Button disabled={data.lines.length === 0} onClick={() => setConfirm('post')}>
              Post the count
            </Button>
          )}
          {canAbandon && (
            <Button variant="secondary" onClick={() => setConfirm('abandon')}>
              Abandon the count
            </Button>
          )}
        </div>
      )}
      {open && !canPost && <p className="text-ink-muted">The owner posts the count once it is done.</p>}

      {data.lines.length === 0 ? (
        <EmptyState title="Nothing counted yet">Differences appear here as lines are counted.</EmptyState>
      ) : (
        <DataTable caption="Differences by line" columns={columns} data={data.lines} getRowId={(l) => l.lineId} filterLabel="Filter lines" />
      )}
      <p className="text-sm text-ink-muted">Expected = what was on hand when the count started, plus the movements on the line until it was counted. Values at each part’s moving-average cost.</p>

      <ConfirmDialog
        open={confirm === 'post'}
        onCancel={() => setConfirm(null)}
        onConfirm={() =>
          post.mutate(countId, {
            onSuccess: () => {
              setConfirm(null);
              toast.show('Count posted: stock now matches what was counted.', 'ok');
            },
            onError: () => setConfirm(null),
          })
        }
        loading={post.isPending}
        title="Post this count?"
        message={
          <>
            {differing === 0 ? 'Every counted line matches: the count confirms the stock.' : `${differing} ${differing === 1 ? 'line changes' : 'lines change'}: ${signed(t.over)} over, ${signed(-t.short)} short, ${money(Math.abs(t.netValueMinor))} ${t.netValueMinor < 0 ? 'less' : 'more'} stock value.`}{' '}
            {data.uncountedCount > 0 ? `${data.uncountedCount} uncounted ${data.uncountedCount === 1 ? 'line stays' : 'lines stay'} as they are. ` : ''}This cannot be undone.
          </>
        }
        confirmLabel="Post the count"
      />
      <ConfirmDialog
        open={confirm === 'abandon'}
        onCancel={() => setConfirm(null)}
        onConfirm={() =>
          abandon.mutate(countId, {
            onSuccess: () => {
              setConfirm(null);
              toast.show('Count abandoned. Stock was not changed.', 'ok');
            },
            onError: () => setConfirm(null),
          })
        }
        loading={abandon.isPending}
        destructive
        title="Abandon this count?"
        message="What has been counted is kept for the record, but stock is not changed and nobody can count on it any more."
        confirmLabel="Abandon the count"
      />
    </div>
  );
}
