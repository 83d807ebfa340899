import { priceRoundingValues, type SalesSettings } from '@tappet/contracts';
import { Button, FormMessage, Select, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { updateSalesSettings } from '../api/write-sales';
import { useSalesMutation } from '../api/sales-mutation';
import { percent } from './words';

const roundingWords: Record<(typeof priceRoundingValues)[number], string> = {
  none: 'No rounding',
  'up-to-5': 'Up to the next 0.05',
  'up-to-10': 'Up to the next 0.10',
  'up-to-50': 'Up to the next 0.50',
  'up-to-100': 'Up to the next whole unit',
  'whole-minus-1': 'Up to the next .99',
};
const origins = ['genuine', 'reproduction', 'pattern'] as const;

const isPercent = (s: string, max: number) => /^\d{1,4}(\.\d{1,3})?$/.test(s.trim()) && Number(s) <= max;

/** The owner's pricing rules, tax rounding and extra tax rates (read-only for everyone else). */
export function PricingSettings({ shopId, settings, canEdit }: { shopId: string; settings: SalesSettings; canEdit: boolean }) {
  const toast = useToast();
  const save = useSalesMutation(shopId, updateSalesSettings);
  const rules = settings.pricingRules;
  const [useListPrice, setUseListPrice] = useState(rules.useListPrice);
  const [defaultMarkup, setDefaultMarkup] = useState(String(rules.defaultMarkupPercent));
  const [rounding, setRounding] = useState(rules.rounding);
  const [originMarkups, setOriginMarkups] = useState<Record<string, string>>(() => Object.fromEntries(origins.map((o) => [o, rules.originMarkups[o] === undefined ? '' : String(rules.originMarkups[o])])));
  const [categories, setCategories] = useState(() => Object.entries(rules.categoryMarkups).map(([name, p]) => ({ name, percent: String(p) })));
  const [taxRounding, setTaxRounding] = useState(settings.taxRounding);
  const [rates, setRates] = useState(() => settings.taxRates.filter((r) => !r.isDefault).map((r) => ({ name: r.name, percent: String(r.ratePercent) })));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const standard = settings.taxRates.find((r) => r.isDefault);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found: Record<string, string> = {};
    if (!isPercent(defaultMarkup, 1000)) found['default'] = 'Enter a markup from 0 to 1000 %, such as 40.';
    for (const o of origins) if (originMarkups[o]?.trim() && !isPercent(originMarkups[o]!, 1000)) found[`origin-${o}`] = 'Enter 0 to 1000, or leave empty.';
    categories.forEach((c, i) => {
      if (!c.name.trim()) found[`cat-name-${i}`] = 'Name the category as it is typed on parts.';
      if (!isPercent(c.percent, 1000)) found[`cat-${i}`] = 'Enter 0 to 1000.';
    });
    rates.forEach((r, i) => {
      if (!r.name.trim()) found[`rate-name-${i}`] = 'Name the rate, such as Reduced.';
      if (!isPercent(r.percent, 100)) found[`rate-${i}`] = 'Enter 0 to 100.';
    });
    setErrors(found);
    if (Object.keys(found).length) return;
    save.mutate(
      {
        pricingRules: {
          useListPrice,
          defaultMarkupPercent: Number(defaultMarkup),
          rounding,
          originMarkups: Object.fromEntries(origins.filter((o) => originMarkups[o]?.trim()).map((o) => [o, Number(originMarkups[o])])),
          categoryMarkups: Object.fromEntries(categories.map((c) => [c.name.trim(), Number(c.percent)])),
        },
        taxRounding,
        extraTaxRates: rates.map((r) => ({ name: r.name.trim(), ratePercent: Number(r.percent) })),
      },
      { onSuccess: () => toast.show('Pricing rules saved. New invoice lines use them; issued invoices keep their prices.', 'ok') },
    );
  };

  return (
    <form className="grid max-w-3xl gap-8" onSubmit={submit} noValidate aria-label="Pricing rules">
      <fieldset disabled={!canEdit} className="grid gap-4">
        <legend className="mb-2 text-lg font-bold">How a part’s sell price is found</legend>
        <p className="text-ink-muted">
          A part’s list price when it has one; otherwise its cost (the moving average of what is in stock) plus the markup of its category, else its origin, else the default. The result is rounded
          up as chosen below. Any line’s price can still be set by hand on a draft invoice.
        </p>
        <label className="flex min-h-touch items-center gap-3">
          <input type="checkbox" className="size-5" checked={useListPrice} onChange={(e) => setUseListPrice(e.target.checked)} />
          Use a part’s list price when it has one
        </label>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Default markup (%)" inputMode="decimal" value={defaultMarkup} onChange={(e) => setDefaultMarkup(e.target.value)} error={errors['default']} />
          <Select label="Rounding" value={rounding} onChange={(e) => setRounding(e.target.value as typeof rounding)} options={priceRoundingValues.map((v) => ({ value: v, label: roundingWords[v] }))} />
        </div>
        <div className="grid gap-4 sm:grid-cols-3">
          {origins.map((o) => (
            <TextField
              key={o}
              label={`Markup for ${o} parts (%)`}
              inputMode="decimal"
              value={originMarkups[o] ?? ''}
              onChange={(e) => setOriginMarkups((m) => ({ ...m, [o]: e.target.value }))}
              error={errors[`origin-${o}`]}
              hint="Empty: the default."
            />
          ))}
        </div>
        <div className="grid gap-3">
          <h3 className="font-bold">Markups by category (checked first)</h3>
          {categories.length === 0 && <p className="text-ink-muted">No category rules.</p>}
          {categories.map((c, i) => (
            <div key={i} className="flex flex-wrap items-end gap-3">
              <TextField label={`Category ${i + 1}`} value={c.name} maxLength={60} error={errors[`cat-name-${i}`]} onChange={(e) => setCategories((list) => list.map((x, j) => (j === i ? { ...x, name: e.target.value } : x)))} />
              <TextField label={`Markup for category ${i + 1} (%)`} inputMode="decimal" value={c.percent} error={errors[`cat-${i}`]} onChange={(e) => setCategories((list) => list.map((x, j) => (j === i ? { ...x, percent: e.target.value } : x)))} />
              <Button variant="ghost" size="sm" onClick={() => setCategories((list) => list.filter((_, j) => j !== i))} aria-label={`Remove category ${i + 1}`}>
                Remove
              </Button>
            </div>
          ))}
          {canEdit && (
            <div>
              <Button variant="secondary" size="sm" onClick={() => setCategories((list) => [...list, { name: '', percent: '' }])}>
                Add a category rule
              </Button>
            </div>
          )}
        </div>
      </fieldset>
      <fieldset disabled={!canEdit} className="grid gap-4">
        <legend className="mb-2 text-lg font-bold">Tax</legend>
        <p className="text-ink-muted">
          The standard rate is {standard ? percent(standard.ratePercent) : '—'} (set on the shop settings screen). Extra rates can be chosen per line. Check the rates and the rounding your tax
          authority expects with your accountant.
        </p>
        <Select
          label="Tax rounding"
          value={taxRounding}
          onChange={(e) => setTaxRounding(e.target.value as typeof taxRounding)}
          options={[
            { value: 'per-line', label: 'Round the tax of each line' },
            { value: 'per-document', label: 'Round the tax once per rate on the whole document' },
          ]}
          hint="The two can differ by a penny or so on a long invoice. Use the one your tax authority and accountant expect."
        />
        {rates.map((r, i) => (
          <div key={i} className="flex flex-wrap items-end gap-3">
            <TextField label={`Extra rate ${i + 1} name`} value={r.name} maxLength={40} error={errors[`rate-name-${i}`]} onChange={(e) => setRates((list) => list.map((x, j) => (j === i ? { ...x, name: e.target.value } : x)))} />
            <TextField label={`Extra rate ${i + 1} (%)`} inputMode="decimal" value={r.percent} error={errors[`rate-${i}`]} onChange={(e) => setRates((list) => list.map((x, j) => (j === i ? { ...x, percent: e.target.value } : x)))} />
            <Button variant="ghost" size="sm" onClick={() => setRates((list) => list.filter((_, j) => j !== i))} aria-label={`Remove extra rate ${i + 1}`}>
              Remove
            </Button>
          </div>
        ))}
        {canEdit && (
          <div>
            <Button variant="secondary" size="sm" onClick={() => setRates((list) => [...list, { name: '', percent: '' }])}>
              Add a tax rate
            </Button>
          </div>
        )}
      </fieldset>
      {save.isError && <FormMessage>{errorMessage(save.error)}</FormMessage>}
      {canEdit ? (
        <div>
          <Button type="submit" loading={save.isPending}>
            Save pricing rules
          </Button>
        </div>
      ) : (
        <p className="text-ink-muted">Only the owner changes pricing rules.</p>
      )}
    </form>
  );
}
