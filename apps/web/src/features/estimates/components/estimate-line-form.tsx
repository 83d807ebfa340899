import { useEffect, useState, type FormEvent } from 'react';
import type { EstimateLineInput, PartSearchResult } from '@tappet/contracts';
import { parseMinorUnits } from '@tappet/domain';
import { Button, Select, TextField } from '@tappet/ui';
import { searchParts } from '../api/search-parts';

const kinds = [
  { value: 'part', label: 'Part from the catalogue' },
  { value: 'labour', label: 'Labour (hours)' },
  { value: 'other', label: 'Other (typed price)' },
];

/**
 * Adds one line to a draft estimate: a part found through the lookup (priced by the shop's
 * rules when the price is left empty), labour hours at the shop's rate, or anything else at a
 * typed price. Nothing typed is lost when the API refuses the line.
 */
export function EstimateLineForm({ shopId, onAdd, busy, error }: { shopId: string; onAdd: (line: EstimateLineInput) => Promise<boolean>; busy: boolean; error: string | null }) {
  const [kind, setKind] = useState<'part' | 'labour' | 'other'>('part');
  const [query, setQuery] = useState('');
  const [results, setResults] = useState<PartSearchResult[]>([]);
  const [part, setPart] = useState<PartSearchResult | null>(null);
  const [description, setDescription] = useState('');
  const [quantity, setQuantity] = useState('1');
  const [price, setPrice] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});

  const searching = kind === 'part' && query.trim().length >= 2 && !part;
  useEffect(() => {
    if (!searching) return;
    const controller = new AbortController();
    const timer = setTimeout(() => {
      searchParts(shopId, query.trim(), controller.signal)
        .then((r) => setResults(r.results))
        .catch(() => undefined);
    }, 250);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [shopId, query, searching]);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const found: Record<string, string> = {};
    if (kind === 'part' && !part) found['part'] = 'Find the part and pick it from the list.';
    if (!description.trim()) found['description'] = 'Describe the line.';
    if (!/^\d{1,6}(\.\d{1,4})?$/.test(quantity.trim()) || Number(quantity) <= 0) found['quantity'] = kind === 'labour' ? 'Give the hours, e.g. 2.5.' : 'Give a quantity above 0.';
    let unitPriceMinor: number | undefined;
    if (price.trim()) {
      try {
        unitPriceMinor = parseMinorUnits(price.trim());
        if (unitPriceMinor < 0) found['price'] = 'Use zero or more.';
      } catch {
        found['price'] = 'Write the price as a number, e.g. 12.50.';
      }
    } else if (kind === 'other') found['price'] = 'Give the price of this line.';
    setErrors(found);
    if (Object.keys(found).length) return;
    const ok = await onAdd({ kind, partId: kind === 'part' ? part!.id : null, description: description.trim(), quantity: quantity.trim(), ...(unitPriceMinor !== undefined ? { unitPriceMinor } : {}) });
    if (ok) {
      setPart(null);
      setQuery('');
      setDescription('');
      setQuantity('1');
      setPrice('');
    }
  };

  return (
    <form className="grid gap-3 rounded-md border-2 border-line p-4" onSubmit={(e) => void submit(e)} noValidate aria-label="Add a line">
      <h3 className="font-bold">Add a line</h3>
      <Select label="Kind of line" value={kind} options={kinds} onChange={(e) => setKind(e.target.value as typeof kind)} />
      {kind === 'part' && (
        <div className="grid gap-2">
          {part ? (
            <p className="flex flex-wrap items-center gap-2">
              <span>
                Part <span className="font-mono font-bold">{part.number}</span> {part.description}
              </span>
              <Button size="sm" variant="secondary" onClick={() => setPart(null)}>
                Choose another part
              </Button>
            </p>
          ) : (
            <TextField label="Find the part" hint="Part number or words, as in the lookup" value={query} onChange={(e) => setQuery(e.target.value)} error={errors['part']} autoComplete="off" />
          )}
          {searching && results.length > 0 && (
            <ul className="grid gap-1" aria-label="Parts found">
              {results.map((r) => (
                <li key={r.id}>
                  <Button
                    size="sm"
                    variant="secondary"
                    onClick={() => {
                      setPart(r);
                      if (!description) setDescription(r.description);
                    }}
                  >
                    <span className="font-mono">{r.number}</span> {r.description}
                  </Button>
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
      <TextField label="Description" value={description} onChange={(e) => setDescription(e.target.value)} error={errors['description']} maxLength={200} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label={kind === 'labour' ? 'Hours' : 'Quantity'} inputMode="decimal" value={quantity} onChange={(e) => setQuantity(e.target.value)} error={errors['quantity']} />
        <TextField
          label="Unit price (before tax)"
          hint={kind === 'part' ? 'Leave empty for the sell price from the pricing rules' : kind === 'labour' ? 'Leave empty for the shop’s labour rate' : undefined}
          inputMode="decimal"
          value={price}
          onChange={(e) => setPrice(e.target.value)}
          error={errors['price']}
        />
      </div>
      {error && (
        <p role="alert" className="font-bold text-fail">
          {error}
        </p>
      )}
      <div>
        <Button type="submit" loading={busy}>
          Add the line
        </Button>
      </div>
    </form>
  );
}
