import { stockConditionLabels, type StockCondition, type ValuationReport } from '@tappet/contracts';
import { buttonClasses, ErrorState, LoadingState, Num, PartNumber } from '@tappet/ui';
import { errorMessage } from '../../../lib/api-client';
import { useValuation, useValueHistory, valuationCsvHref } from '../api/get-valuation';
import { ValueChart } from './value-chart';
import { money } from './words';

const originWords: Record<string, string> = { genuine: 'Genuine', reproduction: 'Reproduction', pattern: 'Pattern' };

function GroupTable({ caption, groups, currency, keyLabel, mono = false }: { caption: string; groups: ValuationReport['byCategory']; currency: string; keyLabel: (key: string) => string; mono?: boolean }) {
  const total = groups.reduce((s, g) => s + g.valueMinor, 0);
  return (
    <table className="w-full">
      <caption className="mb-2 text-left text-lg font-bold">{caption}</caption>
      <thead>
        <tr className="border-b-2 border-line">
          <th scope="col" className="py-2 text-left">
            {caption.replace(/^By /, '').replace(/^./, (c) => c.toUpperCase())}
          </th>
          <th scope="col" className="py-2 text-right">
            Units
          </th>
          <th scope="col" className="py-2 text-right">
            Value
          </th>
          <th scope="col" className="py-2 text-right">
            Share
          </th>
        </tr>
      </thead>
      <tbody>
        {groups.map((g) => (
          <tr key={g.key} className="border-b border-line">
            <th scope="row" className="py-2 text-left font-normal">
              {mono ? <PartNumber>{keyLabel(g.key)}</PartNumber> : keyLabel(g.key)}
            </th>
            <td className="py-2 text-right">
              <Num>{g.quantity}</Num>
            </td>
            <td className="py-2 text-right">
              <Num>{money(g.valueMinor, currency)}</Num>
            </td>
            <td className="py-2 text-right">
              <Num>{total ? `${Math.round((g.valueMinor / total) * 100)}\u00a0%` : '—'}</Num>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** What the stock is worth: total, value over time, by category, origin, condition and bin; CSV export. */
export function ValueReport({ shopId }: { shopId: string }) {
  const report = useValuation(shopId);
  const history = useValueHistory(shopId, 24);
  if (report.isPending) return <LoadingState label="Working out the stock value…" />;
  if (report.isError) return <ErrorState message={errorMessage(report.error)} onRetry={() => void report.refetch()} />;
  const r = report.data;
  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-ink-muted">Stock value (moving average; serialised items at their own cost)</p>
          <p className="text-2xl font-bold" data-testid="stock-value-total">
            <Num>{money(r.totalMinor, r.currency)}</Num>
          </p>
          <p className="text-ink-muted">
            <Num>{r.totalQuantity}</Num> units on hand
          </p>
        </div>
        <a href={valuationCsvHref(shopId)} download className={buttonClasses('secondary')}>
          Export CSV
        </a>
      </div>
      {history.data ? <ValueChart history={history.data} /> : history.isError ? <ErrorState message={errorMessage(history.error)} onRetry={() => void history.refetch()} /> : <LoadingState label="Loading the chart…" />}
      <div className="grid grid-cols-1 gap-8 lg:grid-cols-2">
        <GroupTable caption="By category" groups={r.byCategory} currency={r.currency} keyLabel={(k) => k} />
        <GroupTable caption="By condition" groups={r.byCondition} currency={r.currency} keyLabel={(k) => stockConditionLabels[k as StockCondition] ?? k} />
        <GroupTable caption="By origin" groups={r.byOrigin} currency={r.currency} keyLabel={(k) => originWords[k] ?? k} />
        <GroupTable caption="By bin" groups={r.byBin} currency={r.currency} keyLabel={(k) => k} mono />
      </div>
    </div>
  );
}
