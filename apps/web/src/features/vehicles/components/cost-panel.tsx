import { ErrorState, Num } from '@tappet/ui';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useVehicleCosts } from '../api/get-costs';

/**
 * What a shop-stock vehicle has cost so far (what was paid for it plus every job on it: parts at
 * cost, labour at the rate booked) against its asking price, and the margin left.
 */
export function CostPanel({ shopId, vehicleId, formatMoney }: { shopId: string; vehicleId: string; formatMoney: (minor: number) => string }) {
  const costs = useVehicleCosts(shopId, vehicleId, true);
  return (
    <section aria-labelledby="costs-heading" className="rounded-md border border-line bg-surface p-4">
      <h2 id="costs-heading" className="mb-3 text-lg font-bold">
        Cost and margin
      </h2>
      {costs.isPending && <p className="text-ink-muted">Adding up…</p>}
      {costs.isError && <ErrorState message={errorMessage(costs.error)} onRetry={() => void costs.refetch()} />}
      {costs.data && (
        <>
          <dl className="grid grid-cols-[1fr_auto] gap-y-1">
            <dt>Acquisition cost</dt>
            <dd className="pl-4 text-right">{costs.data.acquisitionCostMinor === null ? <span className="text-ink-muted">not recorded</span> : <Num>{formatMoney(costs.data.acquisitionCostMinor)}</Num>}</dd>
            {costs.data.jobs.map((j) => (
              <div key={j.jobId} className="contents">
                <dt>
                  <Link className="text-accent underline underline-offset-4" to={paths.shop.job.getHref(shopId, j.jobId)}>
                    Job {j.number}
                  </Link>{' '}
                  <span className="text-sm text-ink-muted">{j.title}</span>
                </dt>
                <dd className="pl-4 text-right">
                  <Num>{formatMoney(j.totalMinor)}</Num>
                </dd>
              </div>
            ))}
            <dt className="border-t border-line pt-1 font-bold">Total cost</dt>
            <dd className="border-t border-line pt-1 pl-4 text-right font-bold">
              <Num>{formatMoney(costs.data.totalCostMinor)}</Num>
            </dd>
            <dt>Asking price</dt>
            <dd className="pl-4 text-right">{costs.data.askingPriceMinor === null ? <span className="text-ink-muted">not set</span> : <Num>{formatMoney(costs.data.askingPriceMinor)}</Num>}</dd>
            <dt className="font-bold">Margin</dt>
            <dd className="pl-4 text-right font-bold">
              {costs.data.marginMinor === null ? (
                <span className="font-normal text-ink-muted">needs the acquisition cost and asking price</span>
              ) : (
                <>
                  <Num>{formatMoney(costs.data.marginMinor)}</Num>
                  {costs.data.marginPercent !== null && <span className="ml-1 font-normal text-ink-muted">({costs.data.marginPercent.toFixed(1)}&nbsp;%)</span>}
                </>
              )}
            </dd>
          </dl>
          <p className="mt-2 text-sm text-ink-muted">Jobs count parts at what they cost from stock and labour at the rate it was booked at; tax is not included.</p>
        </>
      )}
    </section>
  );
}
