import type { PartListResponse } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, PageNav, PartNumber } from '@tappet/ui';
import { useMemo, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useParts, type PartListParams } from '../api/get-parts';
import { CatalogueFilters } from './catalogue-filters';
import { PartStatusPill, ProblemCount } from './part-badges';
import { originWords } from './words';

type Row = PartListResponse['items'][number];
const column = createColumnHelper<Row>();

export interface CatalogueListProps {
  shopId: string;
  params: PartListParams;
  filtered: boolean;
  onChange: (change: Partial<PartListParams>) => void;
  onClear: () => void;
  /** What to offer when the catalogue is empty (add / import), for those who may. */
  emptyActions?: ReactNode;
  /** With this, each row gets a checkbox (kept across pages by the caller), e.g. to print labels. */
  selection?: {
    isSelected: (id: string) => boolean;
    onChange: (rows: Row[], selected: boolean) => void;
  };
}

/** The catalogue as a table, filtered and paged by the API. */
export function CatalogueList({ shopId, params, filtered, onChange, onClear, emptyActions, selection }: CatalogueListProps) {
  const parts = useParts(shopId, params);
  const pageRows = parts.data?.items;

  const columns = useMemo(
    () => [
      ...(selection
        ? [
            column.display({
              id: 'select',
              header: () => {
                const rows = pageRows ?? [];
                const chosen = rows.filter((r) => selection.isSelected(r.id)).length;
                return (
                  <input
                    type="checkbox"
                    aria-label="Choose every part on this page"
                    className="h-5 w-5 accent-accent"
                    checked={rows.length > 0 && chosen === rows.length}
                    ref={(el) => {
                      if (el) el.indeterminate = chosen > 0 && chosen < rows.length;
                    }}
                    onChange={(event) => selection.onChange(rows, event.target.checked)}
                  />
                );
              },
              cell: (info) => (
                <input
                  type="checkbox"
                  aria-label={`Choose ${info.row.original.number}`}
                  className="h-5 w-5 accent-accent"
                  checked={selection.isSelected(info.row.original.id)}
                  onChange={(event) => selection.onChange([info.row.original], event.target.checked)}
                />
              ),
            }),
          ]
        : []),
      column.accessor('number', {
        header: 'Number',
        enableSorting: false,
        cell: (info) => (
          <Link to={paths.shop.part.getHref(shopId, info.row.original.id)} className="text-accent underline-offset-4 hover:underline">
            <PartNumber>{info.getValue()}</PartNumber>
          </Link>
        ),
      }),
      column.accessor('description', { header: 'Description', enableSorting: false }),
      column.accessor('origin', { header: 'Origin', enableSorting: false, cell: (info) => originWords[info.getValue()] }),
      column.accessor('category', { header: 'Category', enableSorting: false, cell: (info) => info.getValue() ?? <span className="text-ink-muted">—</span> }),
      column.accessor('status', { header: 'Status', enableSorting: false, cell: (info) => <PartStatusPill status={info.getValue()} /> }),
      column.accessor('problemCount', { header: 'Problems', enableSorting: false, cell: (info) => <ProblemCount count={info.getValue()} /> }),
    ],
    [shopId, selection, pageRows],
  );

  const data = parts.data;
  const categories = data?.categories ?? [];
  const page = data?.page ?? params.page ?? 1;
  const pageSize = data?.pageSize ?? params.pageSize ?? 25;
  const total = data?.total ?? 0;

  let body: ReactNode;
  if (parts.isPending) {
    body = <LoadingState label="Loading the catalogue…" />;
  } else if (parts.isError) {
    body = <ErrorState message={errorMessage(parts.error)} onRetry={() => void parts.refetch()} />;
  } else if (parts.data.items.length === 0 && !filtered && page === 1) {
    body = (
      <EmptyState title="The catalogue is empty" action={emptyActions}>
        Add parts one by one with their numbers as printed, or import a CSV file of parts, then a file of the links between their
        numbers.
        {!emptyActions && ' Ask the owner or the parts buyer to add parts or import a file.'}
      </EmptyState>
    );
  } else if (parts.data.items.length === 0) {
    body = (
      <EmptyState
        title="No parts match these filters"
        action={
          <Button variant="secondary" onClick={onClear}>
            Clear filters
          </Button>
        }
      >
        Try fewer words, part of the number, or another category.
      </EmptyState>
    );
  } else {
    body = (
      <div className="flex flex-col gap-3" aria-busy={parts.isPlaceholderData || undefined}>
        <DataTable
          caption="Parts in the catalogue"
          columns={columns}
          data={parts.data.items}
          getRowId={(row) => row.id}
          pageSize={pageSize}
          // The API pages this list; the table's own "Rows x–y" line would count one page only.
          className="[&>div:last-child]:hidden"
        />
        <PageNav label="Pages of the catalogue" noun="Parts" page={page} pageSize={pageSize} total={total} onPage={(p) => onChange({ page: p })} />
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <CatalogueFilters params={params} categories={categories} onChange={onChange} onClear={onClear} filtered={filtered} />
      {body}
    </div>
  );
}
