import { Button, FormMessage, Num, Panel, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { apiRequest, errorMessage } from '../../../lib/api-client';
import { useSellPrices } from '../api/sell-prices';
import { salesApi } from '../api/keys';
import { useSalesMutation } from '../api/sales-mutation';
import { minorFrom, money } from './words';

const basisWords = {
  list: 'its list price',
  'category-markup': 'cost plus the markup of its category',
  'origin-markup': 'cost plus the markup of its origin',
  'default-markup': 'cost plus the default markup',
  'no-price': 'no price: it has neither a list price nor a cost',
} as const;

const setListPrice = (shopId: string, input: { partId: string; listPriceMinor: number | null }) =>
  apiRequest(`${salesApi(shopId)}/parts/${encodeURIComponent(input.partId)}/list-price`, { method: 'PUT', body: { listPriceMinor: input.listPriceMinor } });

/** A part's sell price on its page; its cost and margin only when the API gives them (never to a mechanic). */
export function PartPricePanel({ shopId, partId, canSetListPrice }: { shopId: string; partId: string; canSetListPrice: boolean }) {
  const prices = useSellPrices(shopId, [partId]);
  const save = useSalesMutation(shopId, setListPrice);
  const toast = useToast();
  const [text, setText] = useState<string | null>(null);
  const [error, setError] = useState<string>();
  const price = prices.data?.prices[0];
  const currency = prices.data?.currency ?? 'GBP';
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const value = (text ?? '').trim();
    const minor = value === '' ? null : minorFrom(value);
    if (value !== '' && minor === null) return setError('Enter a price such as 24.99, or leave it empty for none.');
    setError(undefined);
    save.mutate({ partId, listPriceMinor: minor }, { onSuccess: () => toast.show(minor === null ? 'List price removed.' : 'List price saved.', 'ok') });
  };
  return (
    <Panel title="Sell price" id="part-price-heading" className="mt-6">
      {prices.isPending ? (
        <p>Loading the price…</p>
      ) : prices.isError ? (
        <FormMessage>{errorMessage(prices.error)}</FormMessage>
      ) : price ? (
        <dl className="grid max-w-md grid-cols-[1fr_auto] gap-x-4 gap-y-1">
          <dt>Sell price (before tax)</dt>
          <dd className="text-right font-bold">
            <Num>{money(price.unitMinor, currency)}</Num>
          </dd>
          <dt className="col-span-2 text-ink-muted">From {basisWords[price.basis]}{price.markupPercent !== null ? ` (${price.markupPercent}\u00a0%)` : ''}.</dt>
          {price.unitCostMinor !== undefined && (
            <>
              <dt>Unit cost (moving average)</dt>
              <dd className="text-right">
                <Num>{money(price.unitCostMinor, currency)}</Num>
              </dd>
              <dt>Margin a unit</dt>
              <dd className="text-right">
                <Num>{money(price.marginMinor, currency)}</Num>
              </dd>
            </>
          )}
        </dl>
      ) : null}
      {canSetListPrice && price && (
        <form className="flex flex-wrap items-end gap-2" onSubmit={submit} noValidate>
          <TextField
            label={`List price (${currency})`}
            inputMode="decimal"
            value={text ?? (price.listPriceMinor === null ? '' : (price.listPriceMinor / 100).toFixed(2))}
            onChange={(e) => setText(e.target.value)}
            error={error}
            hint="Empty: priced from cost by the pricing rules."
          />
          <Button type="submit" variant="secondary" loading={save.isPending}>
            Save list price
          </Button>
        </form>
      )}
    </Panel>
  );
}
