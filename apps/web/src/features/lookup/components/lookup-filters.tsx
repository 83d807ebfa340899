import { partOrigins } from '@tappet/contracts';
import { Button, Select, TextField } from '@tappet/ui';
import { useId, useState, type FormEvent } from 'react';
import { useCategories } from '../api/get-categories';
import type { LookupFilters } from '../hooks/use-lookup-filters';

const originWords = { genuine: 'Genuine', reproduction: 'Reproduction', pattern: 'Pattern' } as const;

/** "Fits Corran Mistral 1968 · Brakes · Genuine": the filters in force, in words. */
export function describeFilters(filters: LookupFilters): string {
  const fits = [filters.marque, filters.model, filters.year].filter(Boolean).join(' ');
  return [fits && `Fits ${fits}`, filters.category, filters.origin && originWords[filters.origin]].filter(Boolean).join(' · ');
}

interface Draft {
  marque: string;
  model: string;
  year: string;
  category: string;
  origin: string;
}

const draftOf = (f: LookupFilters): Draft => ({
  marque: f.marque ?? '',
  model: f.model ?? '',
  year: f.year ? String(f.year) : '',
  category: f.category ?? '',
  origin: f.origin ?? '',
});

/**
 * Narrows the lookup to parts that fit a vehicle (marque, model, year), a category or an origin.
 * Closed it takes one line and says what is in force; the fields apply with Enter or "Apply".
 */
export function LookupFiltersPanel({ shopId, filters, count, onChange }: { shopId: string; filters: LookupFilters; count: number; onChange: (next: LookupFilters) => void }) {
  const panelId = useId();
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(() => draftOf(filters));
  const [yearError, setYearError] = useState<string>();
  const categories = useCategories(shopId, open);

  const openPanel = () => {
    setDraft(draftOf(filters));
    setYearError(undefined);
    setOpen(true);
  };

  const apply = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const yearText = draft.year.trim();
    const year = yearText ? Number(yearText) : undefined;
    if (year !== undefined && (!Number.isInteger(year) || year < 1880 || year > 2100)) {
      setYearError('Give a year like 1968 (1880 to 2100).');
      return;
    }
    setYearError(undefined);
    onChange({
      marque: draft.marque.trim() || undefined,
      model: draft.model.trim() || undefined,
      year,
      category: draft.category || undefined,
      origin: (draft.origin || undefined) as LookupFilters['origin'],
    });
    setOpen(false);
  };

  const clear = () => {
    onChange({});
    setDraft(draftOf({}));
    setOpen(false);
  };

  const summary = describeFilters(filters);
  const categoryOptions = [...new Set([...(categories.data ?? []), ...(draft.category ? [draft.category] : [])])].map((c) => ({ value: c, label: c }));
  const set = (key: keyof Draft) => (event: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: event.target.value }));

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" size="sm" aria-expanded={open} aria-controls={panelId} onClick={() => (open ? setOpen(false) : openPanel())}>
          {count > 0 ? `Narrowed (${count})` : 'Narrow down'}
        </Button>
        {summary && (
          <>
            <span className="text-sm text-ink-muted">{summary}</span>
            <Button variant="ghost" size="sm" onClick={clear}>
              Clear
            </Button>
          </>
        )}
      </div>
      {open && (
        <form id={panelId} role="search" aria-label="Narrow the lookup" onSubmit={apply} className="flex flex-col gap-3 rounded-lg border-2 border-line bg-surface p-4">
          <fieldset className="flex flex-wrap items-end gap-3">
            <legend className="mb-1 font-bold">Fits a vehicle</legend>
            <TextField label="Marque" name="marque" value={draft.marque} onChange={set('marque')} maxLength={60} autoComplete="off" fieldClassName="min-w-40 flex-1" />
            <TextField label="Model" name="model" value={draft.model} onChange={set('model')} maxLength={80} autoComplete="off" fieldClassName="min-w-40 flex-1" />
            <TextField label="Year" name="year" inputMode="numeric" value={draft.year} onChange={set('year')} error={yearError} maxLength={4} autoComplete="off" fieldClassName="w-28" />
          </fieldset>
          <div className="flex flex-wrap items-end gap-3">
            <Select label="Category" placeholder={categories.isLoading ? 'Loading categories…' : 'All categories'} options={categoryOptions} value={draft.category} onChange={set('category')} fieldClassName="min-w-44" />
            <Select label="Origin" placeholder="Any origin" options={partOrigins.map((o) => ({ value: o, label: originWords[o] }))} value={draft.origin} onChange={set('origin')} fieldClassName="min-w-40" />
          </div>
          <div className="flex flex-wrap gap-2">
            <Button type="submit">Apply</Button>
            <Button type="button" variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </div>
  );
}
