import { sellPriceBases, type PartSellPrice, type SellPricesResponse } from '@tappet/contracts';
import { finiteOrNull, handChecked, integerOrNull, list, oneOf, record, text } from '../../../lib/hand-check';

// The sell prices answer, checked by hand rather than with sellPricesResponseSchema: the lookup's
// results and the part page show sell prices, and neither should load zod for them
// (docs/decisions/029-part-panels-without-zod.md). part-panel-checks.test.ts holds it to the
// contract's schema, case by case and on generated answers.

function price(v: unknown): PartSellPrice {
  const p = record(v);
  const out: PartSellPrice = {
    partId: text(p['partId']),
    unitMinor: integerOrNull(p['unitMinor']),
    basis: oneOf(sellPriceBases, p['basis']),
    markupPercent: finiteOrNull(p['markupPercent']),
    listPriceMinor: integerOrNull(p['listPriceMinor']),
  };
  // Like zod's optional(): cost and margin come through only when the API gives them.
  if (p['unitCostMinor'] !== undefined) out.unitCostMinor = integerOrNull(p['unitCostMinor']);
  if (p['marginMinor'] !== undefined) out.marginMinor = integerOrNull(p['marginMinor']);
  return out;
}

/** GET …/sales/sell-prices, with the same `safeParse` the API client calls on a zod schema. */
export const sellPricesCheck = handChecked((data): SellPricesResponse => {
  const d = record(data);
  return { currency: text(d['currency']), prices: list(d['prices'], price) };
});
