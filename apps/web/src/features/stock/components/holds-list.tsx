import type { Hold } from '@tappet/contracts';
import { Button, ConfirmDialog, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, Num, PageNav, PartNumber, useToast } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useHolds } from '../api/get-holds';
import { useValuation } from '../api/get-valuation';
import { releaseHold, useStockMutation } from '../api/write-stock';
import { StockActionDialogOnDemand } from './stock-action-dialog-on-demand';
import { BinWithCondition } from './bin-with-condition';

const column = createColumnHelper<Hold>();

/**
 * Holds still active: issue what they set aside, or release it (after a confirmation). `given`:
 * holds (and the shop's currency) the caller already has, e.g. one part's, so nothing is fetched.
 */
export function HoldsList({ shopId, given }: { shopId: string; given?: { holds: Hold[]; currency: string } }) {
  // The held stock screen pages through the API, the page kept in the address.
  const [search, setSearch] = useSearchParams();
  const page = Math.max(1, Number(search.get('page') ?? 1) || 1);
  const query = useHolds(shopId, 'active', { enabled: !given, page });
  const valuation = useValuation(shopId, { enabled: !given });
  const currency = given?.currency ?? valuation.data?.currency ?? 'GBP';
  const canHold = useCan('hold', 'Stock', { shopId });
  const canIssue = useCan('issue', 'Stock', { shopId });
  const [releasing, setReleasing] = useState<Hold | null>(null);
  const [issuing, setIssuing] = useState<Hold | null>(null);
  const release = useStockMutation(shopId, (s: string, holdId: string) => releaseHold(s, holdId));
  const toast = useToast();
  const holds = given?.holds ?? query.data?.holds;
  // A page from the API keeps the API's order: sorting one page would look like sorting them all.
  const sortable = given !== undefined;

  const columns = useMemo(
    () => [
      column.accessor('partNumber', {
        enableSorting: sortable,
        header: 'Part',
        cell: (info) => (
          <Link to={paths.shop.part.getHref(shopId, info.row.original.partId)} className="text-accent underline-offset-4 hover:underline">
            <PartNumber>{info.getValue()}</PartNumber>
          </Link>
        ),
      }),
      // Condition under the bin and the person under the purpose: the row's actions then fit on a
      // tablet in landscape.
      column.accessor('binCode', {
        enableSorting: sortable,
        header: 'Bin and condition',
        cell: (info) => <BinWithCondition code={info.getValue()} condition={info.row.original.condition} />,
      }),
      column.accessor('quantity', { enableSorting: sortable, header: 'Held', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('purpose', {
        enableSorting: sortable,
        header: 'Held for',
        cell: (info) => (
          <>
            {info.getValue()}
            {info.row.original.createdByName && <span className="block text-sm text-ink-muted">by {info.row.original.createdByName}</span>}
          </>
        ),
      }),
      column.display({
        id: 'actions',
        header: 'Actions',
        cell: (info) => {
          const hold = info.row.original;
          return (
            <div className="flex flex-nowrap gap-1">
              {canIssue && (
                <Button size="sm" variant="secondary" aria-label={`Issue ${hold.partNumber} held for ${hold.purpose}`} onClick={() => setIssuing(hold)}>
                  Issue
                </Button>
              )}
              {canHold && (
                <Button size="sm" variant="secondary" aria-label={`Release ${hold.partNumber} held for ${hold.purpose}`} onClick={() => setReleasing(hold)}>
                  Release
                </Button>
              )}
            </div>
          );
        },
      }),
    ],
    [shopId, canHold, canIssue, sortable],
  );

  if (!holds) {
    if (query.isError) return <ErrorState message={errorMessage(query.error)} onRetry={() => void query.refetch()} />;
    return <LoadingState label="Loading holds…" />;
  }
  return (
    <>
      {holds.length === 0 && page === 1 ? (
        <EmptyState title="Nothing is held">Hold stock from the stock list or a part&apos;s page to set it aside for a job.</EmptyState>
      ) : !given && query.data && holds.length === 0 ? (
        // Past the last page (its last hold was just issued or released, or an old link).
        <EmptyState
          title="No holds on this page"
          action={
            <Button variant="secondary" onClick={() => setSearch(new URLSearchParams())}>
              Show the first page
            </Button>
          }
        >
          {query.data.total} {query.data.total === 1 ? 'hold is' : 'holds are'} active in all.
        </EmptyState>
      ) : given || !query.data ? (
        <DataTable caption="Stock held" columns={columns} data={holds} getRowId={(h) => h.id} />
      ) : (
        <div className="flex flex-col gap-3" aria-busy={query.isPlaceholderData || undefined}>
          {/* The API pages this list; the table's own row count would count one page only. The
              count follows the rows shown (the page being left stays until the next arrives). */}
          <DataTable caption="Stock held, longest held first" columns={columns} data={holds} getRowId={(h) => h.id} pageSize={query.data.pageSize} className="[&>div:last-child]:hidden" />
          <PageNav
            label="Pages of held stock"
            noun="Holds"
            page={query.data.page}
            pageSize={query.data.pageSize}
            total={query.data.total}
            onPage={(p) => {
              const next = new URLSearchParams(search);
              if (p > 1) next.set('page', String(p));
              else next.delete('page');
              setSearch(next);
            }}
          />
        </div>
      )}
      <ConfirmDialog
        open={releasing !== null}
        title="Release this hold?"
        message={releasing ? `${releasing.quantity} × ${releasing.partNumber} in ${releasing.binCode}, held for ${releasing.purpose}, becomes free for anyone to issue.` : ''}
        confirmLabel="Release"
        loading={release.isPending}
        onCancel={() => setReleasing(null)}
        onConfirm={() =>
          releasing &&
          release.mutate(releasing.id, {
            onSuccess: () => {
              toast.show(`Released ${releasing.partNumber}.`, 'ok');
              setReleasing(null);
            },
            onError: (error) => {
              toast.show(errorMessage(error), 'fail');
              setReleasing(null);
            },
          })
        }
      />
      <StockActionDialogOnDemand
        shopId={shopId}
        action={issuing ? 'issue' : null}
        currency={currency}
        preset={issuing ? { partId: issuing.partId, partNumber: issuing.partNumber, binId: issuing.binId, condition: issuing.condition, holdId: issuing.id, quantity: issuing.quantity, holdPurpose: issuing.purpose } : undefined}
        onClose={() => setIssuing(null)}
      />
    </>
  );
}
