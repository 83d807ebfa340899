import type { InvoiceSummary } from '@tappet/contracts';
import { createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, Num, Select, StatusPill, TextField } from '@tappet/ui';
import { Fragment, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useInvoices, type InvoiceFilters } from '../api/get-invoices';
import { documentTitle, money, paymentWords, sourceWords } from './words';

const column = createColumnHelper<InvoiceSummary>();

const statusOptions = [
  { value: '', label: 'Every state' },
  { value: 'draft', label: 'Drafts' },
  { value: 'unpaid', label: 'Issued, unpaid' },
  { value: 'part_paid', label: 'Issued, part paid' },
  { value: 'paid', label: 'Issued, paid' },
];

/** Invoices and credit notes, drafts first then newest, filtered by state, customer and period. */
export function InvoicesList({ shopId }: { shopId: string }) {
  const [filters, setFilters] = useState<InvoiceFilters>({});
  const invoices = useInvoices(shopId, filters);
  const set = (patch: Partial<InvoiceFilters>) => setFilters((f) => ({ ...f, ...patch }));
  const columns = useMemo(
    () => [
      column.accessor('number', {
        header: 'Document',
        cell: (info) => (
          <Link to={paths.shop.salesInvoice.getHref(shopId, info.row.original.id)} className="font-mono text-accent">
            {/* The line may break before the number, never inside it (at its dash). */}
            {documentTitle(info.row.original)
              .split(' ')
              .map((word, i) => (
                <Fragment key={i}>
                  {i > 0 && ' '}
                  <span className="whitespace-nowrap">{word}</span>
                </Fragment>
              ))}
          </Link>
        ),
      }),
      // Where it came from under the customer: the table fits a tablet in landscape.
      column.accessor((row) => `${row.customerName} ${sourceWords[row.source]}`, {
        id: 'customer',
        header: 'Customer',
        cell: (info) => (
          <>
            {info.row.original.customerName}
            <span className="block text-sm text-ink-muted">{sourceWords[info.row.original.source]}</span>
          </>
        ),
      }),
      column.accessor('paymentStatus', {
        header: 'State',
        cell: (info) => {
          const row = info.row.original;
          if (row.status === 'draft') return <StatusPill status="na" label="Draft" />;
          if (row.kind === 'credit_note') return <StatusPill status="na" label="Credit note" />;
          return <StatusPill status={paymentWords[row.paymentStatus].status} label={paymentWords[row.paymentStatus].label} />;
        },
      }),
      column.accessor('grossMinor', { header: 'Total', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('dueMinor', { header: 'Due', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('issuedAt', { header: 'Date', meta: { cellClassName: 'whitespace-nowrap' }, cell: (info) => (info.getValue() ?? info.row.original.createdAt).slice(0, 10) }),
    ],
    [shopId],
  );
  return (
    <>
      <form role="search" aria-label="Filter invoices" className="mb-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4" onSubmit={(e) => e.preventDefault()}>
        <Select label="State" value={filters.status ?? ''} onChange={(e) => set({ status: (e.target.value || undefined) as InvoiceFilters['status'] })} options={statusOptions} />
        <TextField label="Customer or number" type="search" value={filters.q ?? ''} onChange={(e) => set({ q: e.target.value || undefined })} />
        <TextField label="From" type="date" value={filters.from ?? ''} onChange={(e) => set({ from: e.target.value || undefined })} />
        <TextField label="To" type="date" value={filters.to ?? ''} onChange={(e) => set({ to: e.target.value || undefined })} />
      </form>
      {invoices.isPending ? (
        <LoadingState label="Loading invoices…" />
      ) : invoices.isError ? (
        <ErrorState message={errorMessage(invoices.error)} onRetry={() => void invoices.refetch()} />
      ) : invoices.data.invoices.length === 0 ? (
        <EmptyState title="No invoices here">Invoice a job from its page, make a counter sale, or change the filters.</EmptyState>
      ) : (
        <>
          <DataTable caption="Invoices and credit notes" columns={columns} data={invoices.data.invoices} filterLabel="Filter this page" getRowId={(i) => i.id} />
          {invoices.data.total > invoices.data.invoices.length && (
            <p className="mt-2 text-sm text-ink-muted">
              Showing the latest {invoices.data.invoices.length} of {invoices.data.total}. Narrow the period to see older ones.
            </p>
          )}
        </>
      )}
    </>
  );
}
