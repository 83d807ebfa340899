import type { PartSearchResult } from '@tappet/contracts';
import { Button, EmptyState, FormMessage, Num, TextField } from '@tappet/ui';
import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { searchParts } from '../api/search-parts';
import { useSellPrices } from '../api/sell-prices';
import { counterSale } from '../api/write-sales';
import { useSalesMutation } from '../api/sales-mutation';
import { money } from './words';

interface CartLine {
  key: string;
  partId: string;
  number: string;
  description: string;
  binId: string;
  binCode: string;
  condition: string;
  free: number;
  quantity: string;
}

const conditionWords = (c: string) => c.replace(/_/g, ' ');

/**
 * Selling parts over the counter to a walk-in customer: find parts through the lookup, choose the
 * bin to take them from, then the stock is issued and the invoice issued together.
 */
export function CounterSale({ shopId, currency }: { shopId: string; currency: string }) {
  const navigate = useNavigate();
  const [q, setQ] = useState('');
  const [search, setSearch] = useState('');
  const [cart, setCart] = useState<CartLine[]>([]);
  const [customerName, setCustomerName] = useState('');
  const [customerEmail, setCustomerEmail] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const results = useQuery({ queryKey: ['shops', shopId, 'sales', 'counter-search', search], queryFn: ({ signal }) => searchParts(shopId, search, signal), enabled: search.length > 0 });
  const partIds = [...new Set([...(results.data?.results.map((r) => r.id) ?? []), ...cart.map((c) => c.partId)])];
  const prices = useSellPrices(shopId, partIds);
  const priceOf = (partId: string) => prices.data?.prices.find((p) => p.partId === partId)?.unitMinor ?? null;
  const sale = useSalesMutation(shopId, counterSale);

  const add = (part: PartSearchResult, line: NonNullable<PartSearchResult['stock']>['lines'][number]) => {
    const key = `${part.id}|${line.binId}|${line.condition}`;
    setCart((c) => (c.some((l) => l.key === key) ? c : [...c, { key, partId: part.id, number: part.number, description: part.description, binId: line.binId, binCode: line.binCode, condition: line.condition, free: line.free, quantity: '1' }]));
  };
  const total = cart.reduce((sum, l) => sum + (priceOf(l.partId) ?? 0) * (Number(l.quantity) || 0), 0);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found: Record<string, string> = {};
    for (const l of cart) {
      const n = Number(l.quantity);
      if (!Number.isInteger(n) || n < 1) found[l.key] = 'Whole units, at least 1.';
      else if (n > l.free) found[l.key] = `Only ${l.free} free in ${l.binCode}.`;
      else if (priceOf(l.partId) === null) found[l.key] = 'This part has no sell price: give it a list price first.';
    }
    if (customerEmail.trim() && !/^[^@\s]+@[^@\s]+\.[^@\s]+$/.test(customerEmail.trim())) found['email'] = 'Enter an e-mail address such as name@example.test, or leave it empty.';
    setErrors(found);
    if (Object.keys(found).length || cart.length === 0) return;
    sale.mutate(
      {
        customerName: customerName.trim() || 'Counter sale',
        customerEmail: customerEmail.trim() || null,
        lines: cart.map((l) => ({ partId: l.partId, binId: l.binId, condition: l.condition, quantity: Number(l.quantity) })),
      },
      { onSuccess: (r) => navigate(paths.shop.salesInvoice.getHref(shopId, r.id)) },
    );
  };

  return (
    <div className="grid gap-8 lg:grid-cols-2">
      <section aria-labelledby="find-heading">
        <h2 id="find-heading" className="mb-2 text-lg font-bold">
          Find parts
        </h2>
        <form
          role="search"
          className="flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            setSearch(q.trim());
          }}
        >
          <TextField label="Part number or words" type="search" value={q} onChange={(e) => setQ(e.target.value)} fieldClassName="grow" />
          <Button type="submit" variant="secondary">
            Look up
          </Button>
        </form>
        <div className="mt-4" aria-live="polite">
          {results.isFetching && <p>Looking up…</p>}
          {results.isError && <FormMessage>{errorMessage(results.error)}</FormMessage>}
          {results.data && results.data.results.length === 0 && <p>Nothing matches “{search}”.</p>}
          <ul className="grid gap-3">
            {results.data?.results.map((part) => (
              <li key={part.id} className="rounded border-2 border-line p-3">
                <p className="font-bold">
                  <span className="font-mono">{part.number}</span> {part.description}
                </p>
                <p className="text-ink-muted">Sell price {money(priceOf(part.id), currency)}</p>
                {(part.stock?.lines ?? []).filter((l) => l.free > 0).length === 0 ? (
                  <p className="text-ink-muted">None free in stock.</p>
                ) : (
                  <ul className="mt-2 flex flex-wrap gap-2">
                    {part.stock!.lines
                      .filter((l) => l.free > 0)
                      .map((l) => (
                        <li key={`${l.binId}|${l.condition}`}>
                          <Button size="sm" variant="secondary" onClick={() => add(part, l)} aria-label={`Add ${part.number} from ${l.binCode} (${conditionWords(l.condition)}, ${l.free} free)`}>
                            Add from {l.binCode} · {conditionWords(l.condition)} · {l.free} free
                          </Button>
                        </li>
                      ))}
                  </ul>
                )}
              </li>
            ))}
          </ul>
        </div>
      </section>
      <section aria-labelledby="sale-heading">
        <h2 id="sale-heading" className="mb-2 text-lg font-bold">
          This sale
        </h2>
        {cart.length === 0 ? (
          <EmptyState title="Nothing added yet">Look up a part and add it from the bin it is taken from.</EmptyState>
        ) : (
          <form className="grid gap-4" onSubmit={submit} noValidate>
            <ul className="grid gap-3">
              {cart.map((l) => (
                <li key={l.key} className="flex flex-wrap items-end gap-3 border-b border-line pb-3">
                  <div className="grow">
                    <p className="font-bold">
                      <span className="font-mono">{l.number}</span> {l.description}
                    </p>
                    <p className="text-ink-muted">
                      {l.binCode} · {conditionWords(l.condition)} · {money(priceOf(l.partId), currency)} each
                    </p>
                  </div>
                  <TextField
                    label={`Quantity of ${l.number}`}
                    inputMode="numeric"
                    value={l.quantity}
                    error={errors[l.key]}
                    fieldClassName="w-40"
                    onChange={(e) => {
                      setCart((c) => c.map((x) => (x.key === l.key ? { ...x, quantity: e.target.value } : x)));
                      setErrors(({ [l.key]: _changed, ...rest }) => rest);
                    }}
                  />
                  <Button size="sm" variant="ghost" onClick={() => setCart((c) => c.filter((x) => x.key !== l.key))} aria-label={`Remove ${l.number}`}>
                    Remove
                  </Button>
                </li>
              ))}
            </ul>
            <p className="text-right">
              Net before tax <Num>{money(total, currency)}</Num>
            </p>
            <TextField label="Customer name (optional)" value={customerName} onChange={(e) => setCustomerName(e.target.value)} maxLength={120} hint="Left empty, the invoice says “Counter sale”." />
            <TextField label="Customer e-mail (optional)" type="email" value={customerEmail} onChange={(e) => setCustomerEmail(e.target.value)} error={errors['email']} hint="The invoice PDF is e-mailed here." />
            {sale.isError && <FormMessage>{errorMessage(sale.error)}</FormMessage>}
            <Button type="submit" loading={sale.isPending}>
              Complete sale and issue invoice
            </Button>
          </form>
        )}
      </section>
    </div>
  );
}
