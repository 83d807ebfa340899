import { Num } from '@tappet/ui';
import { useSellPrices } from '../api/sell-prices';
import { money } from './words';

/**
 * A lookup result's sell price in one line ("Sell £24.99 before tax"), so the counter can quote
 * without opening the part. Every result passes the same ids, so the results shown share one
 * request. Nothing while it loads, when it fails, or when the part has no price: the lookup is
 * about finding the part, and the part's page says why there is no price.
 */
export function ResultSellPrice({ shopId, partId, partIds }: { shopId: string; partId: string; partIds: readonly string[] }) {
  const prices = useSellPrices(shopId, partIds);
  const price = prices.data?.prices.find((p) => p.partId === partId);
  if (!prices.data || !price || price.unitMinor === null) return null;
  return (
    <span className="block text-sm" data-testid="lookup-sell-price">
      <span className="font-bold">Sell</span> <Num className="font-bold">{money(price.unitMinor, prices.data.currency)}</Num> <span className="text-ink-muted">before tax</span>
    </span>
  );
}
