import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { useId, useState, type ReactNode } from 'react';
import { Button } from './button';
import { cn } from './cn';
import { inputClasses } from './form-field';
import { IconSort } from './icons';
import { EmptyState } from './states';

declare module '@tanstack/react-table' {
  // Column hints the DataTable understands. (Type parameters are required by the augmentation.)
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Right-aligned, monospaced, tabular figures: quantities and money. */
    numeric?: boolean;
    /** Classes for the cells of this column. */
    cellClassName?: string;
  }
}

export interface DataTableProps<T> {
  /** Names the table for everyone (rendered as the caption). */
  caption: string;
  /** Show the caption visually too (it is always read by screen readers). */
  showCaption?: boolean;
  // Column value types differ per column; TanStack's own examples type the array this way.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  data: T[];
  /** Adds a text filter over all columns with this label, e.g. "Filter parts". */
  filterLabel?: string;
  /** Rows per page; paging controls appear only when there is more than one page. */
  pageSize?: number;
  /** Shown when there are no rows at all. Say how to add some. */
  empty?: ReactNode;
  initialSorting?: SortingState;
  getRowId?: (row: T, index: number) => string;
  className?: string;
}

/**
 * A table on TanStack Table with sorting (header buttons that announce the order through
 * aria-sort), an optional filter, paging and empty states.
 */
export function DataTable<T>({
  caption,
  showCaption = false,
  columns,
  data,
  filterLabel,
  pageSize = 20,
  empty,
  initialSorting = [],
  getRowId,
  className,
}: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize });
  const filterId = useId();
  const statusId = useId();

  // TanStack Table returns functions that the React Compiler cannot memoise safely; this is the
  // documented way to use it, so the hook lint's compiler hint is not relevant here.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter, pagination },
    onSortingChange: setSorting,
    onGlobalFilterChange: (value: string) => {
      setGlobalFilter(value);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    getRowId,
    // Always ascending first, so one press means the same thing on every column.
    sortDescFirst: false,
  });

  if (data.length === 0) {
    return <div className={className}>{empty ?? <EmptyState title="Nothing here yet" />}</div>;
  }

  const rows = table.getRowModel().rows;
  const filteredCount = table.getFilteredRowModel().rows.length;
  const pageCount = table.getPageCount();
  const first = filteredCount === 0 ? 0 : pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(filteredCount, (pagination.pageIndex + 1) * pagination.pageSize);

  return (
    <div className={cn('flex flex-col gap-3', className)}>
      {filterLabel && (
        <div className="flex max-w-md flex-col gap-1">
          <label htmlFor={filterId} className="font-bold">
            {filterLabel}
          </label>
          <input
            id={filterId}
            type="search"
            value={globalFilter}
            onChange={(e) => table.setGlobalFilter(e.target.value)}
            className={inputClasses(false)}
            aria-controls={statusId}
          />
        </div>
      )}
      {/* Positioned: the screen-reader-only text inside (positioned absolutely) then scrolls with
          the table instead of widening the whole page when the table is wider than the screen. */}
      <div className="relative overflow-x-auto rounded-md border-2 border-line">
        <table className="w-full border-collapse text-left">
          <caption className={showCaption ? 'p-3 text-left text-lg font-bold' : 'sr-only'}>{caption}</caption>
          <thead className="bg-sunk">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const numeric = header.column.columnDef.meta?.numeric;
                  const label = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : header.column.getCanSort() ? 'none' : undefined}
                      className={cn('border-b-2 border-line px-3 py-2 font-bold', numeric && 'text-right')}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={cn('-mx-2 inline-flex min-h-touch items-center gap-1 rounded-sm px-2 font-bold hover:bg-line/40', numeric && 'flex-row-reverse')}
                        >
                          <span>{label}</span>
                          <IconSort sortOrder={sorted} />
                        </button>
                      ) : (
                        label
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-line bg-surface last:border-b-0">
                {row.getVisibleCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  return (
                    <td key={cell.id} className={cn('px-3 py-3 align-top', meta?.numeric && 'text-right font-mono tabular', meta?.cellClassName)}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="bg-surface px-3 py-6">
                  <p className="font-bold">No rows match “{globalFilter}”.</p>
                  <Button variant="ghost" size="sm" className="mt-2 -ml-3" onClick={() => table.setGlobalFilter('')}>
                    Clear the filter
                  </Button>
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p id={statusId} role="status" className="text-ink-muted">
          {filteredCount === 0 ? 'No rows' : `Rows ${first}–${last} of ${filteredCount}`}
        </p>
        {pageCount > 1 && (
          <div className="flex items-center gap-2">
            <Button variant="secondary" size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
              Previous page
            </Button>
            <span className="tabular">
              Page {pagination.pageIndex + 1} of {pageCount}
            </span>
            <Button variant="secondary" size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
              Next page
            </Button>
          </div>
        )}
      </div>
    </div>
  );
}

export type { ColumnDef, SortingState } from '@tanstack/react-table';
export { createColumnHelper } from '@tanstack/react-table';
