import { FormField, inputClasses, PartNumber, Spinner } from '@tappet/ui';
import { useId, useState } from 'react';
import { useParts } from '../api/get-parts';
import { useDebouncedValue } from '../hooks/use-debounced-value';

/** The chosen other end of a link: a part of the catalogue, or a number that is not in it (yet). */
export type PickedPart = { partId: string; number: string } | { partId: null; number: string };

export interface PartPickerProps {
  shopId: string;
  label: string;
  value: PickedPart | null;
  onChange: (value: PickedPart | null) => void;
  /** Leave this part out of the choices (a part does not link to itself here). */
  excludePartId?: string;
  error?: string;
}

const keyOf = (n: string) => n.toUpperCase().replace(/[^A-Z0-9]/g, '');

/**
 * Finds a part by number or description through the catalogue's own search, and offers the
 * number as typed when it is not in the catalogue.
 */
export function PartPicker({ shopId, label, value, onChange, excludePartId, error }: PartPickerProps) {
  const [text, setText] = useState(value?.number ?? '');
  const query = useDebouncedValue(text.trim());
  const results = useParts(shopId, { q: query, pageSize: 8 }, { enabled: query.length > 0 });
  const groupId = useId();
  const items = (query.length > 0 ? (results.data?.items ?? []) : []).filter((p) => p.id !== excludePartId);
  const typedKey = keyOf(query);
  const exact = items.some((p) => p.key === typedKey || keyOf(p.number) === typedKey);
  const selectedValue = value ? (value.partId ?? `number:${value.number}`) : '';

  return (
    <FormField label={label} error={error} hint="Type part of the number or a word of the description, then choose.">
      {(control) => (
        <div className="flex flex-col gap-2">
          <input
            {...control}
            type="search"
            value={text}
            onChange={(e) => {
              setText(e.target.value);
              onChange(null);
            }}
            className={inputClasses(Boolean(error), 'font-mono')}
            autoComplete="off"
            spellCheck={false}
            aria-controls={groupId}
          />
          <div id={groupId} role="radiogroup" aria-label={`Matches for ${label.toLowerCase()}`} className="flex flex-col gap-1">
            {results.isFetching && query.length > 0 && (
              <span className="flex items-center gap-2 text-sm text-ink-muted" role="status">
                <Spinner size={16} /> Searching…
              </span>
            )}
            {items.map((p) => (
              <label key={p.id} className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-line bg-surface px-3 has-checked:border-accent">
                <input type="radio" name={`${groupId}-pick`} className="size-5 accent-(--tp-accent)" checked={selectedValue === p.id} onChange={() => onChange({ partId: p.id, number: p.number })} />
                <PartNumber>{p.number}</PartNumber>
                <span className="truncate text-ink-muted">{p.description}</span>
              </label>
            ))}
            {query.length > 0 && !exact && !results.isFetching && (
              <label className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-dashed border-line bg-surface px-3 has-checked:border-accent">
                <input
                  type="radio"
                  name={`${groupId}-pick`}
                  className="size-5 accent-(--tp-accent)"
                  checked={selectedValue === `number:${query}`}
                  onChange={() => onChange({ partId: null, number: query })}
                />
                <span>
                  Use <PartNumber>{query}</PartNumber> as typed (not in the catalogue yet)
                </span>
              </label>
            )}
          </div>
        </div>
      )}
    </FormField>
  );
}
