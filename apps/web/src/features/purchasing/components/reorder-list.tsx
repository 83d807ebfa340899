import type { ReorderListResponse, ReorderSuggestion, SpecialOrderSuggestion } from '@tappet/contracts';
import { Button, EmptyState, ErrorState, FormMessage, LoadingState, Num, PartNumber, useToast } from '@tappet/ui';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useReorderList } from '../api/get-reorder-list';
import { draftFromReorder } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { DemandChart } from './demand-chart';
import { ReorderSettings } from './reorder-settings';
import { money, two } from './words';

/** Why one suggestion is what it is: the figures, the sentences, the charts. */
function Explanation({ s }: { s: ReorderSuggestion }) {
  const facts: Array<[string, string]> = [
    ['Demand', `${two(s.demand.total)} over ${s.demand.windowDays} days: ${two(s.demand.meanPerDay)} a day${s.demand.sdPerDay === null ? '' : `, standard deviation ${two(s.demand.sdPerDay)}`}`],
    ['Lead time', `${two(s.leadTime.days)} days${s.leadTime.sdDays ? ` ± ${two(s.leadTime.sdDays)}` : ''}`],
    ['Service level', `${two(s.serviceLevel * 100)}\u00a0% → z = ${s.z.toFixed(3)}`],
    ['Safety stock', two(s.safetyStock)],
    ['Reorder point', two(s.reorderPoint)],
    ['Economic order quantity', s.eoq === null ? 'not known (no unit cost)' : two(s.eoq)],
    ['Stock position', `${two(s.supply.position)} = ${s.supply.free} free + ${s.supply.onOrder} on order + ${two(s.supply.substitutes)} from parts that can fill it`],
  ];
  return (
    <div className="flex flex-col gap-4 rounded-md border-2 border-line bg-surface p-4">
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        {facts.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-bold">{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
      {s.demand.fedBy.length > 0 && (
        <div>
          <h4 className="font-bold">Numbers that fed this demand</h4>
          <ul className="list-disc pl-6">
            {s.demand.fedBy.map((f) => (
              <li key={f.partId}>
                <PartNumber>{f.number}</PartNumber>: {two(f.quantity)}
                {f.ownDemandOnly ? ' (its own stock covers only demand under this number)' : ''}
              </li>
            ))}
          </ul>
        </div>
      )}
      <ol className="list-decimal pl-6">
        {s.reasons.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ol>
      <DemandChart suggestion={s} />
    </div>
  );
}

/** One supplier's suggestions, with the minimum-order shortfall. */
function Group({ shopId, group, suggestions, selected, toggle }: { shopId: string; group: ReorderListResponse['groups'][number]; suggestions: ReorderSuggestion[]; selected: Set<string>; toggle: (id: string) => void }) {
  const [open, setOpen] = useState<string | null>(null);
  return (
    <section className="mb-8" aria-labelledby={`group-${group.supplierId ?? 'none'}`}>
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`group-${group.supplierId ?? 'none'}`} className="text-lg font-bold">
          {group.supplierName ?? 'No supplier lists these'}
        </h2>
        {group.supplierId && (
          <p>
            Total <Num>{money(group.totalMinor, group.currency)}</Num>
            {group.specialOrderIds.length > 0 && <span className="ml-1 text-ink-muted">(with {group.specialOrderIds.length} special order{group.specialOrderIds.length === 1 ? '' : 's'})</span>}
            {group.shortfallMinor > 0 ? (
              <span className="ml-2 font-bold text-advise">
                {money(group.shortfallMinor, group.currency)} short of the {money(group.minOrderValueMinor, group.currency)} minimum order
              </span>
            ) : group.minOrderValueMinor > 0 ? (
              <span className="ml-2">meets the minimum order</span>
            ) : null}
          </p>
        )}
      </div>
      <div className="relative overflow-x-auto">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Suggestions for {group.supplierName ?? 'parts without a supplier'}</caption>
          <thead>
            <tr className="border-b-2 border-line">
              <th scope="col" className="p-2">
                <span className="sr-only">Choose</span>
              </th>
              <th scope="col" className="p-2">Part</th>
              <th scope="col" className="p-2 text-right">Position</th>
              <th scope="col" className="p-2 text-right">Reorder point</th>
              <th scope="col" className="p-2 text-right">Order</th>
              <th scope="col" className="p-2 text-right">Value</th>
              <th scope="col" className="p-2">Why</th>
            </tr>
          </thead>
          <tbody>
            {suggestions.map((s) => (
              <FragmentRow key={s.partId} shopId={shopId} s={s} checked={selected.has(s.partId)} toggle={toggle} open={open === s.partId} setOpen={(o) => setOpen(o ? s.partId : null)} />
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

function FragmentRow({ shopId, s, checked, toggle, open, setOpen }: { shopId: string; s: ReorderSuggestion; checked: boolean; toggle: (id: string) => void; open: boolean; setOpen: (open: boolean) => void }) {
  return (
    <>
      <tr className="border-b border-line align-top">
        <td className="p-2">
          <input type="checkbox" className="h-6 w-6 accent-accent" checked={checked} disabled={!s.supplierId} onChange={() => toggle(s.partId)} aria-label={`Order ${s.partNumber}`} />
        </td>
        <td className="p-2">
          <Link to={paths.shop.part.getHref(shopId, s.partId)} className="text-accent">
            <PartNumber>{s.partNumber}</PartNumber>
          </Link>
          <div className="text-sm text-ink-muted">{s.description}</div>
          {s.method === 'min_max' && <div className="text-sm">Minimum/maximum set by hand</div>}
        </td>
        <td className="p-2 text-right">
          <Num>{two(s.supply.position)}</Num>
        </td>
        <td className="p-2 text-right">
          <Num>{two(s.reorderPoint)}</Num>
        </td>
        <td className="p-2 text-right">
          <Num>{s.quantity}</Num>
          {s.packSize > 1 && <div className="text-sm text-ink-muted">packs of {s.packSize}</div>}
        </td>
        <td className="p-2 text-right">
          <Num>{money(s.valueMinor, s.currency)}</Num>
        </td>
        <td className="p-2">
          <Button size="sm" variant="secondary" aria-expanded={open} aria-label={`${open ? 'Hide' : 'Explain'} ${s.partNumber}`} onClick={() => setOpen(!open)}>
            {open ? 'Hide' : 'Explain'}
          </Button>
        </td>
      </tr>
      {open && (
        <tr>
          <td colSpan={7} className="p-2">
            <Explanation s={s} />
          </td>
        </tr>
      )}
    </>
  );
}

/** Jobs' special orders waiting to be bought: bought for the job whatever the stock position, held for it on arrival. */
function SpecialOrders({ shopId, rows, selected, toggle }: { shopId: string; rows: SpecialOrderSuggestion[]; selected: Set<string>; toggle: (id: string) => void }) {
  return (
    <section className="mb-8" aria-labelledby="special-orders-heading">
      <h2 id="special-orders-heading" className="mb-1 text-lg font-bold">
        Special orders for jobs
      </h2>
      <p className="mb-2 max-w-prose text-ink-muted">Parts a job needs that were not in stock. What arrives is held for the job.</p>
      <div className="relative overflow-x-auto">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Special orders for jobs</caption>
          <thead>
            <tr className="border-b-2 border-line">
              <th scope="col" className="p-2">
                <span className="sr-only">Choose</span>
              </th>
              <th scope="col" className="p-2">Part</th>
              <th scope="col" className="p-2">For</th>
              <th scope="col" className="p-2">Supplier</th>
              <th scope="col" className="p-2 text-right">Needed</th>
              <th scope="col" className="p-2 text-right">Order</th>
              <th scope="col" className="p-2 text-right">Value</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.specialOrderId} className="border-b border-line align-top">
                <td className="p-2">
                  <input
                    type="checkbox"
                    className="h-6 w-6 accent-accent"
                    checked={selected.has(r.specialOrderId)}
                    disabled={!r.supplierId}
                    onChange={() => toggle(r.specialOrderId)}
                    aria-label={`Order ${r.partNumber} for job ${r.jobNumber}`}
                  />
                </td>
                <td className="p-2">
                  <Link to={paths.shop.part.getHref(shopId, r.partId)} className="text-accent">
                    <PartNumber>{r.partNumber}</PartNumber>
                  </Link>
                  <div className="text-sm text-ink-muted">{r.description}</div>
                  {r.free > 0 && <div className="text-sm">{r.free} free in stock: you could hold those for the job instead</div>}
                </td>
                <td className="p-2">
                  <Link to={paths.shop.job.getHref(shopId, r.jobId)} className="text-accent underline underline-offset-4">
                    Job {r.jobNumber}
                  </Link>
                  <div className="text-sm text-ink-muted">asked {r.requestedAt.slice(0, 10)}</div>
                </td>
                <td className="p-2">{r.supplierName ?? 'No supplier lists it'}</td>
                <td className="p-2 text-right">
                  <Num>{r.needed}</Num>
                </td>
                <td className="p-2 text-right">
                  <Num>{r.quantity}</Num>
                  {r.quantity > r.needed && <div className="text-sm text-ink-muted">rounded up to the pack</div>}
                </td>
                <td className="p-2 text-right">
                  <Num>{money(r.valueMinor, r.currency)}</Num>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/** The reorder list: suggestions grouped by supplier, each explaining itself; slow movers and dead stock below. */
export function ReorderList({ shopId }: { shopId: string }) {
  const list = useReorderList(shopId);
  const canDraft = useCan('create', 'PurchaseOrder', { shopId });
  const canSet = useCan('update', 'Settings', { shopId });
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [selectedSpecial, setSelectedSpecial] = useState<Set<string>>(new Set());
  const draft = usePurchasingMutation(shopId, draftFromReorder);
  const toast = useToast();
  const navigate = useNavigate();
  const [problem, setProblem] = useState<string | null>(null);

  if (list.isPending) return <LoadingState label="Working out the reorder list…" />;
  if (list.isError) return <ErrorState message={errorMessage(list.error)} onRetry={() => void list.refetch()} />;
  const data = list.data;
  const flip = (old: Set<string>, id: string) => {
    const next = new Set(old);
    if (next.has(id)) next.delete(id);
    else next.add(id);
    return next;
  };
  const toggle = (id: string) => setSelected((old) => flip(old, id));
  const toggleSpecial = (id: string) => setSelectedSpecial((old) => flip(old, id));
  const count = selected.size + selectedSpecial.size;

  function onDraft() {
    setProblem(null);
    draft.mutate({ partIds: [...selected], specialOrderIds: [...selectedSpecial] }, {
      onSuccess: (result) => {
        setSelected(new Set());
        setSelectedSpecial(new Set());
        toast.show(`${result.orders.length} draft order${result.orders.length === 1 ? '' : 's'} written.`, 'ok');
        if (result.skipped.length) setProblem(result.skipped.map((s) => s.reason).join(' '));
        const first = result.orders[0];
        if (result.orders.length === 1 && first) navigate(paths.shop.purchasingOrder.getHref(shopId, first.id));
      },
      onError: (error) => setProblem(errorMessage(error)),
    });
  }

  return (
    <>
      <p className="mb-4 max-w-prose text-ink-muted">
        Demand over the last {data.settings.demandWindowDays} days, a {two(data.settings.serviceLevel * 100)}&nbsp;% service level, ordering cost {money(data.settings.orderingCostMinor, data.settings.currency)} and holding
        cost {two(data.settings.holdingCostRatePercent)}&nbsp;% a year.
      </p>
      {canSet && <ReorderSettings shopId={shopId} />}
      {problem && <FormMessage>{problem}</FormMessage>}
      {data.suggestions.length === 0 && data.specialOrders.length === 0 ? (
        <EmptyState title="Nothing to reorder">Every part with demand is above its reorder point, or already on order, and no job is waiting for a special order.</EmptyState>
      ) : (
        <>
          {canDraft && (
            <div className="sticky top-16 z-10 mb-4 flex flex-wrap items-center gap-3 bg-ground py-2">
              <Button onClick={onDraft} disabled={count === 0} loading={draft.isPending}>
                Draft orders for {count} selected
              </Button>
              <Button
                variant="secondary"
                onClick={() => {
                  setSelected(new Set(data.suggestions.filter((s) => s.supplierId).map((s) => s.partId)));
                  setSelectedSpecial(new Set(data.specialOrders.filter((s) => s.supplierId).map((s) => s.specialOrderId)));
                }}
              >
                Select all with a supplier
              </Button>
            </div>
          )}
          {data.specialOrders.length > 0 && <SpecialOrders shopId={shopId} rows={data.specialOrders} selected={selectedSpecial} toggle={toggleSpecial} />}
          {data.groups
            .filter((g) => g.partIds.length > 0)
            .map((g) => (
              <Group key={g.supplierId ?? 'none'} shopId={shopId} group={g} suggestions={data.suggestions.filter((s) => s.supplierId === g.supplierId)} selected={selected} toggle={toggle} />
            ))}
        </>
      )}
      <StockHealth title="Dead stock" rows={data.deadStock} currency={data.settings.currency} empty={`Nothing has sat unissued for ${data.settings.deadStockDays} days.`} />
      <StockHealth title="Slow movers" rows={data.slowMovers} currency={data.settings.currency} empty="No slow movers." />
    </>
  );
}

function StockHealth({ title, rows, currency, empty }: { title: string; rows: ReorderListResponse['deadStock']; currency: string; empty: string }) {
  const total = rows.reduce((s, r) => s + r.valueMinor, 0);
  return (
    <section className="mb-8">
      <h2 className="mb-2 text-lg font-bold">
        {title} <span className="font-normal text-ink-muted">— {money(total, currency)}</span>
      </h2>
      {rows.length === 0 ? (
        <p>{empty}</p>
      ) : (
        <div className="relative overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">{title}</caption>
            <thead>
              <tr className="border-b-2 border-line">
                <th scope="col" className="p-2">Part</th>
                <th scope="col" className="p-2 text-right">On hand</th>
                <th scope="col" className="p-2 text-right">Value</th>
                <th scope="col" className="p-2">Last issued</th>
              </tr>
            </thead>
            <tbody>
              {rows.slice(0, 50).map((r) => (
                <tr key={r.partId} className="border-b border-line">
                  <td className="p-2">
                    <PartNumber>{r.partNumber}</PartNumber> <span className="text-ink-muted">{r.description}</span>
                  </td>
                  <td className="p-2 text-right">
                    <Num>{r.onHand}</Num>
                  </td>
                  <td className="p-2 text-right">
                    <Num>{money(r.valueMinor, currency)}</Num>
                  </td>
                  <td className="p-2">{r.lastIssuedAt ? r.lastIssuedAt.slice(0, 10) : 'Never'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
