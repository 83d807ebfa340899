import { useState } from 'react';
import type { ReportPeriod } from '@tappet/contracts';
import { ErrorState, LoadingState, Select, TextField, buttonClasses } from '@tappet/ui';
import { subjectOf } from '@tappet/permissions';
import { useAppAbility } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useFormatMoney } from '../../../lib/shop-settings';
import { marginsCsvHref, salesCsvHref, unpaidCsvHref, useMargins, useSalesByPeriod, useUnpaid, type ReportWindow } from '../api/reports';
import { BarChart } from './bar-chart';

const periods = [
  { value: 'day', label: 'By day' },
  { value: 'week', label: 'By week (from Monday)' },
  { value: 'month', label: 'By month' },
];
const bucketWords: Record<string, string> = { '0-30': '0–30 days', '31-60': '31–60 days', '61-90': '61–90 days', '90+': 'Over 90 days' };
const shortLabel = (label: string) => label.replace(/^week of /, '');

/**
 * The shop's sales: issued invoices less credit notes by period, gross margin on parts and labour
 * (owners only), and invoices still unpaid by how long ago they were issued; each with a chart,
 * its figures, and a CSV export.
 */
export function SalesReports({ shopId }: { shopId: string }) {
  const money = useFormatMoney(shopId);
  // Field-level rule, as in the API: only the owner sees margins.
  const canMargins = useAppAbility().can('read', subjectOf('SalesReport', { shopId }), 'margin');
  const [period, setPeriod] = useState<ReportPeriod>('month');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const w: ReportWindow = { period, ...(from ? { from } : {}), ...(to ? { to } : {}) };
  const sales = useSalesByPeriod(shopId, w);
  const margins = useMargins(shopId, w, canMargins);
  const unpaid = useUnpaid(shopId);

  return (
    <div className="grid gap-10">
      <form className="flex flex-wrap items-end gap-4" aria-label="Report window" onSubmit={(e) => e.preventDefault()}>
        <Select label="Periods" value={period} options={periods} onChange={(e) => setPeriod(e.target.value as ReportPeriod)} fieldClassName="w-56" />
        <TextField label="From" type="date" value={from} onChange={(e) => setFrom(e.target.value)} fieldClassName="w-48" hint="Empty: the last 12 periods" />
        <TextField label="To" type="date" value={to} onChange={(e) => setTo(e.target.value)} fieldClassName="w-48" hint="Empty: today" />
      </form>

      <section aria-labelledby="sales-heading" className="grid gap-4">
        <div className="flex flex-wrap items-end justify-between gap-4">
          <h2 id="sales-heading" className="text-lg font-bold">
            Sales by period
          </h2>
          <a href={salesCsvHref(shopId, w)} download className={buttonClasses('secondary', 'sm')}>
            Export CSV
          </a>
        </div>
        {sales.isPending ? (
          <LoadingState label="Loading sales…" />
        ) : sales.isError ? (
          <ErrorState message={errorMessage(sales.error)} onRetry={() => void sales.refetch()} />
        ) : (
          <>
            <p>
              Net <span className="font-bold">{money(sales.data.totals.netMinor)}</span> · tax {money(sales.data.totals.taxMinor)} · with tax <span className="font-bold" data-testid="sales-gross-total">{money(sales.data.totals.grossMinor)}</span> ({sales.data.from} to {sales.data.to})
            </p>
            {sales.data.rows.every((r) => r.invoices === 0 && r.creditNotes === 0) ? (
              <p className="rounded-lg border-2 border-dashed border-line p-6 text-ink-muted">No invoices or credit notes were issued in this window.</p>
            ) : (
              <BarChart title="Net sales by period" description={`Net sales less credit notes, ${sales.data.rows.length} periods, ${money(sales.data.totals.netMinor)} in all.`} bars={sales.data.rows.map((r) => ({ key: r.start, label: shortLabel(r.label), value: r.netMinor }))} format={money} />
            )}
            <details>
              <summary className="min-h-touch cursor-pointer font-bold">Show the figures</summary>
              <div className="relative overflow-x-auto">
                <table className="mt-2 w-full">
                  <caption className="sr-only">Sales by period</caption>
                  <thead>
                    <tr className="text-left text-sm text-ink-muted">
                      <th scope="col">Period</th>
                      <th scope="col" className="text-right">Invoices</th>
                      <th scope="col" className="text-right">Credit notes</th>
                      <th scope="col" className="text-right">Net</th>
                      <th scope="col" className="text-right">Tax</th>
                      <th scope="col" className="text-right">With tax</th>
                    </tr>
                  </thead>
                  <tbody>
                    {sales.data.rows.map((r) => (
                      <tr key={r.start} className="border-t border-line">
                        <td>{r.label}</td>
                        <td className="text-right tabular-nums">{r.invoices}</td>
                        <td className="text-right tabular-nums">{r.creditNotes}</td>
                        <td className="text-right tabular-nums">{money(r.netMinor)}</td>
                        <td className="text-right tabular-nums">{money(r.taxMinor)}</td>
                        <td className="text-right tabular-nums">{money(r.grossMinor)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </details>
          </>
        )}
      </section>

      {canMargins && (
        <section aria-labelledby="margins-heading" className="grid gap-4">
          <div className="flex flex-wrap items-end justify-between gap-4">
            <h2 id="margins-heading" className="text-lg font-bold">
              Gross margin
            </h2>
            <a href={marginsCsvHref(shopId, w)} download className={buttonClasses('secondary', 'sm')}>
              Export CSV
            </a>
          </div>
          {margins.isPending ? (
            <LoadingState label="Loading margins…" />
          ) : margins.isError ? (
            <ErrorState message={errorMessage(margins.error)} onRetry={() => void margins.refetch()} />
          ) : (
            <>
              <p>
                Parts: sold {money(margins.data.totals.partsNetMinor)}, cost at issue {money(margins.data.totals.partsCostMinor)}, margin <span className="font-bold">{money(margins.data.totals.partsMarginMinor)}</span>
                {margins.data.totals.partsNetMinor !== 0 && ` (${((margins.data.totals.partsMarginMinor / margins.data.totals.partsNetMinor) * 100).toFixed(1)}%)`}. Labour: <span className="font-bold">{money(margins.data.totals.labourMarginMinor)}</span>.
              </p>
              <p className="text-sm text-ink-muted">Labour’s margin is its net sales: Tappet records no wage costs. {margins.data.totals.partsWithoutCost > 0 && `${margins.data.totals.partsWithoutCost} part lines had no cost recorded and count at full margin.`}</p>
              {margins.data.rows.every((r) => r.partsNetMinor === 0 && r.labourNetMinor === 0) ? (
                <p className="rounded-lg border-2 border-dashed border-line p-6 text-ink-muted">No parts or labour were invoiced in this window.</p>
              ) : (
                <BarChart title="Gross margin on parts and labour by period" description={`Parts and labour margin together, ${money(margins.data.totals.partsMarginMinor + margins.data.totals.labourMarginMinor)} in all.`} bars={margins.data.rows.map((r) => ({ key: r.start, label: shortLabel(r.label), value: r.partsMarginMinor + r.labourMarginMinor }))} format={money} />
              )}
            </>
          )}
        </section>
      )}

      <section aria-labelledby="unpaid-heading" className="grid gap-4">
        <div className="flex flex-wrap items-end justify-between gap-4">
          <h2 id="unpaid-heading" className="text-lg font-bold">
            Unpaid invoices by age
          </h2>
          <a href={unpaidCsvHref(shopId)} download className={buttonClasses('secondary', 'sm')}>
            Export CSV
          </a>
        </div>
        {unpaid.isPending ? (
          <LoadingState label="Loading unpaid invoices…" />
        ) : unpaid.isError ? (
          <ErrorState message={errorMessage(unpaid.error)} onRetry={() => void unpaid.refetch()} />
        ) : (
          <>
            <p>
              Due in all: <span className="font-bold">{money(unpaid.data.totalDueMinor)}</span> on {unpaid.data.invoices.length} invoice{unpaid.data.invoices.length === 1 ? '' : 's'} (as of {unpaid.data.asOf})
            </p>
            {unpaid.data.invoices.length === 0 ? (
              <p className="rounded-lg border-2 border-dashed border-line p-6 text-ink-muted">Every issued invoice is paid.</p>
            ) : (
              <BarChart title="Unpaid amounts by age" description={unpaid.data.buckets.map((b) => `${bucketWords[b.bucket]}: ${money(b.dueMinor)}`).join('; ')} bars={unpaid.data.buckets.map((b) => ({ key: b.bucket, label: bucketWords[b.bucket]!, value: b.dueMinor }))} format={money} />
            )}
            {unpaid.data.invoices.length > 0 && (
              <div className="relative overflow-x-auto">
                <table className="w-full">
                  <caption className="sr-only">Unpaid invoices, oldest first</caption>
                  <thead>
                    <tr className="text-left text-sm text-ink-muted">
                      <th scope="col">Invoice</th>
                      <th scope="col">Customer</th>
                      <th scope="col">Issued</th>
                      <th scope="col">Age</th>
                      <th scope="col" className="text-right">Due</th>
                    </tr>
                  </thead>
                  <tbody>
                    {unpaid.data.invoices.map((r) => (
                      <tr key={r.invoiceId} className="border-t border-line">
                        <td className="font-mono">{r.number}</td>
                        <td>{r.customerName}</td>
                        <td>{r.issuedOn}</td>
                        <td>
                          {r.ageDays} days ({bucketWords[r.bucket]})
                        </td>
                        <td className="text-right tabular-nums">{money(r.dueMinor)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </>
        )}
      </section>
    </div>
  );
}
