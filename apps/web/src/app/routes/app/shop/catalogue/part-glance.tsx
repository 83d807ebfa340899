import type { PartStockResponse } from '@tappet/contracts';
import { useQuery } from '@tanstack/react-query';
import { partStockQueryOptions } from '../../../../../features/stock/api/get-part-stock';
import { sellPricesQueryOptions } from '../../../../../features/sales/api/sell-prices';
import { money } from '../../../../../features/sales/components/words';

/**
 * A part's stock in a few words, for the line near its number: "14 free in C-08, CORE · 2 held",
 * "None free · 3 held", or "None in stock · KV 2210A has 4 free" when another number can fill a
 * demand for it. The stock panel further down has the detail.
 */
export function stockGlance(s: Pick<PartStockResponse, 'stock' | 'fillOptions'>): string {
  const { stock } = s;
  const bins = [...new Set(stock.lines.filter((l) => l.free > 0).map((l) => l.binCode))];
  const where = bins.length === 0 ? '' : bins.length <= 2 ? ` in ${bins.join(', ')}` : ` in ${bins.length} bins`;
  const held = stock.held > 0 ? ` · ${stock.held} held` : '';
  if (stock.free > 0) return `${stock.free} free${where}${held}`;
  const head = stock.onHand === 0 ? 'None in stock' : 'None free';
  const other = s.fillOptions.flatMap((o) => o.parts).find((p) => p.stock.free > 0);
  return `${head}${held}${other ? ` · ${other.number} has ${other.stock.free} free` : ''}`;
}

/**
 * The part's stock and sell price on one line under its number, so the counter need not scroll to
 * the panels. Asked for once the part is painted, like the panels (which share these answers); it
 * keeps its line's height while loading, so nothing below moves when it fills in.
 */
export function PartGlance({ shopId, partId, painted, canReadStock }: { shopId: string; partId: string; painted: boolean; canReadStock: boolean }) {
  const stock = useQuery({ ...partStockQueryOptions(shopId, partId), enabled: painted && canReadStock });
  const prices = useQuery({ ...sellPricesQueryOptions(shopId, [partId]), enabled: painted });
  const price = prices.data?.prices[0];
  return (
    <p data-testid="part-glance" className="flex min-h-[2.75rem] flex-wrap content-start items-baseline gap-x-4 gap-y-1 text-sm sm:min-h-[1.5rem]">
      {canReadStock && (
        <span>
          <span className="font-bold">Stock:</span> {stock.data ? stockGlance(stock.data) : stock.isError ? 'not known just now' : '…'}
        </span>
      )}
      <span>
        <span className="font-bold">Sell price:</span> {price ? (price.unitMinor === null ? 'none set' : `${money(price.unitMinor, prices.data?.currency)} before tax`) : prices.isError ? 'not known just now' : '…'}
      </span>
      {canReadStock && (
        <a href="#part-stock-heading" className="text-accent underline underline-offset-4">
          Stock and actions
        </a>
      )}
    </p>
  );
}
