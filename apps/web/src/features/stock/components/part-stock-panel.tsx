import type { StockSummary } from '@tappet/contracts';
import { Button, ErrorState, LoadingState, MenuButton, Num, Panel, PartNumber } from '@tappet/ui';
import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { usePartStock } from '../api/get-part-stock';
import { BinWithCondition } from './bin-with-condition';
import type { StockAction, StockActionPreset } from './stock-action-dialog';
import { StockActionDialogOnDemand } from './stock-action-dialog-on-demand';
import { conditionLabel, money } from './words';

// Its table (and the table library) loads only for a part that has holds.
const HoldsList = lazy(() => import('./holds-list').then((m) => ({ default: m.HoldsList })));

/** "3 free in B-04 (new), 1 in B-07 (used, good)" — or "none". */
export function stockWhere(stock: StockSummary): string {
  const free = stock.lines.filter((l) => l.free > 0);
  if (free.length === 0) return stock.onHand > 0 ? `none free (${stock.onHand} held)` : 'none';
  return free.map((l) => `${l.free} in ${l.binCode} (${conditionLabel(l.condition).toLowerCase()})`).join(', ');
}

/** A part's stock on its page: lines per bin and condition, holds, serialised items, value, and what else can fill the demand. */
export function PartStockPanel({ shopId, partId }: { shopId: string; partId: string }) {
  const stock = usePartStock(shopId, partId);
  const [dialog, setDialog] = useState<{ action: StockAction; preset: StockActionPreset } | null>(null);
  const can = {
    receive: useCan('receive', 'Stock', { shopId }),
    issue: useCan('issue', 'Stock', { shopId }),
    hold: useCan('hold', 'Stock', { shopId }),
    move: useCan('move', 'Stock', { shopId }),
    adjust: useCan('adjust', 'Stock', { shopId }),
    count: useCan('count', 'Stock', { shopId }),
  };
  if (stock.isPending) return <LoadingState label="Loading stock…" />;
  if (stock.isError) return <ErrorState message={errorMessage(stock.error)} onRetry={() => void stock.refetch()} />;
  const s = stock.data;
  const base = { partId: s.partId, partNumber: s.number };
  const act = (action: StockAction, label: string, preset: StockActionPreset, where: string) => (
    <Button size="sm" variant="secondary" aria-label={`${label} ${s.number} ${where}`} onClick={() => setDialog({ action, preset })}>
      {label}
    </Button>
  );

  return (
    <Panel
      title="Stock"
      id="part-stock-heading"
      className="mt-6"
      actions={
        <>
          {can.receive && <Button onClick={() => setDialog({ action: 'receive', preset: base })}>Receive</Button>}
          <Link to={paths.shop.stockMovements.getHref(shopId, `partId=${s.partId}`)} className="flex min-h-touch items-center text-accent underline underline-offset-4">
            Movements of {s.number}
          </Link>
        </>
      }
    >
      <p data-testid="part-stock-summary">
        On hand <Num className="font-bold">{s.stock.onHand}</Num> · held <Num className="font-bold">{s.stock.held}</Num> · free <Num className="font-bold">{s.stock.free}</Num>
      </p>

      {s.stock.lines.length === 0 ? (
        <p className="text-ink-muted">None of this number on hand.</p>
      ) : (
        // A narrow frame scrolls the table sideways rather than squeezing its action buttons.
        <div className="-mx-1 overflow-x-auto px-1">
          <table className="w-full">
            <caption className="sr-only">Stock of {s.number} per bin and condition</caption>
            <thead>
              <tr className="border-b-2 border-line text-left">
                <th scope="col" className="px-2 py-2">Bin and condition</th>
                <th scope="col" className="px-2 py-2 text-right whitespace-nowrap">On hand</th>
                <th scope="col" className="px-2 py-2 text-right whitespace-nowrap">Held</th>
                <th scope="col" className="px-2 py-2 text-right whitespace-nowrap">Free</th>
                <th scope="col" className="px-2 py-2">Actions</th>
              </tr>
            </thead>
            <tbody>
              {s.stock.lines.map((l) => {
                const preset = { ...base, binId: l.binId, condition: l.condition };
                const where = `from ${l.binCode}, ${conditionLabel(l.condition).toLowerCase()}`;
                // The everyday two as buttons and the rest in a menu, as in the stock list: a line
                // stays one row high on a phone instead of stacking five buttons.
                const more = [
                  ...(can.move && l.free > 0 ? [{ key: 'move', label: `Move ${s.number} ${where}`, onSelect: () => setDialog({ action: 'move', preset }) }] : []),
                  ...(can.adjust ? [{ key: 'adjust', label: `Adjust ${s.number} ${where}`, onSelect: () => setDialog({ action: 'adjust', preset }) }] : []),
                  ...(can.count ? [{ key: 'count', label: `Count ${s.number} ${where}`, onSelect: () => setDialog({ action: 'count', preset }) }] : []),
                ];
                return (
                  <tr key={`${l.binId}|${l.condition}`} className="border-b border-line">
                    <td className="px-2 py-2">
                      <BinWithCondition code={l.binCode} condition={l.condition} />
                    </td>
                    <td className="px-2 py-2 text-right">
                      <Num>{l.onHand}</Num>
                    </td>
                    <td className="px-2 py-2 text-right">
                      <Num>{l.held}</Num>
                    </td>
                    <td className="px-2 py-2 text-right">
                      <Num className="font-bold">{l.free}</Num>
                    </td>
                    <td className="px-2 py-2">
                      <div className="flex flex-nowrap gap-1">
                        {can.issue && l.free > 0 && act('issue', 'Issue', preset, where)}
                        {can.hold && l.free > 0 && act('hold', 'Hold', preset, where)}
                        {more.length > 0 && <MenuButton label="More" accessibleLabel={`More actions for ${s.number} ${where}`} variant="secondary" align="end" items={more} />}
                      </div>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}

      {s.fillOptions.length > 0 && (
        <div>
          <h3 className="font-bold">Other numbers that can fill a demand for {s.number}</h3>
          <ul className="mt-2 flex flex-col gap-2">
            {s.fillOptions.map((o, i) => (
              <li key={i} className="rounded-md border-2 border-line p-3">
                {o.parts.map((p) => (
                  <p key={p.partId}>
                    {p.quantity !== 1 && <Num>{p.quantity} × </Num>}
                    <Link to={paths.shop.part.getHref(shopId, p.partId)} className="text-accent underline-offset-4 hover:underline">
                      <PartNumber className="font-bold">{p.number}</PartNumber>
                    </Link>{' '}
                    {p.description} — <strong>{stockWhere(p.stock)}</strong>
                  </p>
                ))}
                <p className="text-sm text-ink-muted">
                  {o.via.join(' · ')}
                  {o.needsChanges && ' · fits only with changes'}
                </p>
              </li>
            ))}
          </ul>
        </div>
      )}

      {s.holds.length > 0 && (
        <div>
          <h3 className="mb-2 font-bold">Held</h3>
          <Suspense fallback={<LoadingState label="Loading holds…" />}>
            <HoldsList shopId={shopId} given={{ holds: s.holds, currency: s.currency }} />
          </Suspense>
        </div>
      )}

      {s.serials.length > 0 && (
        <table className="w-full">
          <caption className="mb-2 text-left font-bold">Items tracked by number</caption>
          <thead>
            <tr className="border-b-2 border-line text-left">
              <th scope="col" className="px-2 py-2">Number</th>
              <th scope="col" className="px-2 py-2">Where</th>
              <th scope="col" className="px-2 py-2">Condition</th>
              <th scope="col" className="px-2 py-2 text-right whitespace-nowrap">Cost</th>
            </tr>
          </thead>
          <tbody>
            {s.serials.map((item) => (
              <tr key={item.id} className="border-b border-line">
                <td className="px-2 py-2">
                  <PartNumber>{item.serial}</PartNumber>
                </td>
                <td className="px-2 py-2">{item.inStock ? <PartNumber>{item.binCode ?? ''}</PartNumber> : 'Issued'}</td>
                <td className="px-2 py-2">{conditionLabel(item.condition)}</td>
                <td className="px-2 py-2 text-right">
                  <Num>{money(item.costMinor, s.currency)}</Num>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}

      {s.valuation.length > 0 && (
        <p data-testid="part-stock-value">
          Value:{' '}
          {s.valuation.map((v, i) => (
            <span key={v.condition}>
              {i > 0 && ' · '}
              {conditionLabel(v.condition)} <Num className="font-bold">{money(v.valueMinor, s.currency)}</Num>
              {v.unitCostMinor !== null && (
                <span className="text-ink-muted">
                  {' '}
                  (average <Num>{money(Math.round(v.unitCostMinor), s.currency)}</Num> each)
                </span>
              )}
              {v.method === 'specific' && <span className="text-ink-muted"> (each at its own cost)</span>}
            </span>
          ))}
        </p>
      )}

      <StockActionDialogOnDemand shopId={shopId} action={dialog?.action ?? null} preset={dialog?.preset} currency={s.currency} onClose={() => setDialog(null)} />
    </Panel>
  );
}
