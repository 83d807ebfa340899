import { partOrigins, partStatuses } from '@tappet/contracts';
import { Button, Select, TextField } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import type { PartListParams } from '../api/get-parts';
import { originWords, statusWordsOf } from './words';

export interface CatalogueFiltersProps {
  params: PartListParams;
  categories: string[];
  onChange: (change: Partial<PartListParams>) => void;
  onClear: () => void;
  filtered: boolean;
}

/**
 * The list's filters. Choices apply at once; the search text applies on Enter or "Search", so
 * the list does not jump while someone types a number.
 */
export function CatalogueFilters({ params, categories, onChange, onClear, filtered }: CatalogueFiltersProps) {
  const [text, setText] = useState(params.q ?? '');
  // Follow the URL when it changes from outside (back button, "Clear filters").
  const [lastQ, setLastQ] = useState(params.q);
  if (lastQ !== params.q) {
    setLastQ(params.q);
    setText(params.q ?? '');
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    onChange({ q: text.trim() || undefined });
  }

  // A category in the URL that the response no longer lists stays choosable, so the select shows it.
  const categoryOptions = [...new Set([...categories, ...(params.category ? [params.category] : [])])].map((c) => ({ value: c, label: c }));

  return (
    <form role="search" aria-label="Filter the catalogue" onSubmit={onSubmit} className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-4">
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label="Number or description"
          type="search"
          name="q"
          value={text}
          onChange={(e) => setText(e.target.value)}
          autoComplete="off"
          spellCheck={false}
          fieldClassName="min-w-56 flex-1"
        />
        <Button type="submit">Search</Button>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <Select
          label="Category"
          placeholder="All categories"
          options={categoryOptions}
          value={params.category ?? ''}
          onChange={(e) => onChange({ category: e.target.value || undefined })}
          fieldClassName="min-w-44"
        />
        <Select
          label="Origin"
          placeholder="Any origin"
          options={partOrigins.map((o) => ({ value: o, label: originWords[o] }))}
          value={params.origin ?? ''}
          onChange={(e) => onChange({ origin: (e.target.value || undefined) as PartListParams['origin'] })}
          fieldClassName="min-w-40"
        />
        <Select
          label="Status"
          placeholder="Any status"
          options={partStatuses.map((s) => ({ value: s, label: statusWordsOf[s] }))}
          value={params.status ?? ''}
          onChange={(e) => onChange({ status: (e.target.value || undefined) as PartListParams['status'] })}
          fieldClassName="min-w-44"
        />
        <label className="flex min-h-touch items-center gap-2 font-bold">
          <input
            type="checkbox"
            className="size-5 accent-(--tp-accent)"
            checked={Boolean(params.problemsOnly)}
            onChange={(e) => onChange({ problemsOnly: e.target.checked || undefined })}
          />
          Problems only
        </label>
        {filtered && (
          <Button variant="ghost" onClick={onClear}>
            Clear filters
          </Button>
        )}
      </div>
    </form>
  );
}
