import type { LookupMatch, PartOrigin, PartSearchResult } from '@tappet/contracts';
import { useQueryClient } from '@tanstack/react-query';
import { Button, CameraScanButton, EmptyState, ErrorState, LoadingState, PartNumber, Spinner, StatusPill, cn } from '@tappet/ui';
import { useEffect, useId, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { searchPartsQueryOptions, useSearchParts } from '../api/search-parts';
import { useDebouncedValue } from '../hooks/use-debounced-value';
import { useRecentLookups, type RecentLookup } from '../hooks/use-recent-lookups';
import { useScannerInput } from '../hooks/use-scanner-input';
import { useLookupFilters } from '../hooks/use-lookup-filters';
import { LookupFiltersPanel } from './lookup-filters';
import { LookupStock } from './lookup-stock';

/** Typing pauses this long before a lookup is sent. */
export const LOOKUP_DEBOUNCE_MS = 150;

const matchWords: Record<LookupMatch, string> = { exact: 'Exact', lineage: 'Related', partial: 'Partial', fuzzy: 'Close' };
const originWords: Record<PartOrigin, string> = { genuine: 'Genuine', reproduction: 'Reproduction', pattern: 'Pattern' };

/** Whether a key press belongs to some other field, so "/" there is just a slash. */
function typingElsewhere(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName);
}

/**
 * The bench lookup: one large field, results as you type (the last answer stays while the next
 * loads), arrow keys and Enter to open a part, "/" to come back to the field, recent lookups when
 * it is empty. A keyboard-wedge scanner's code followed by Enter opens an exact hit directly.
 */
export interface LookupScreenProps {
  shopId: string;
  userId: string;
  /**
   * More about a result, under its stock line (the route puts the sell price there). Given the
   * result's id and the ids of every result shown, so one request can serve them all.
   */
  resultExtra?: (partId: string, shownIds: readonly string[]) => ReactNode;
}

export function LookupScreen({ shopId, userId, resultExtra }: LookupScreenProps) {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const inputRef = useRef<HTMLInputElement>(null);
  const listId = useId();
  const [text, setText] = useState('');
  const [active, setActive] = useState({ q: '', index: 0 });
  const [opening, setOpening] = useState(false);
  const q = useDebouncedValue(text.trim(), LOOKUP_DEBOUNCE_MS);
  const { filters, setFilters, count: filterCount } = useLookupFilters();
  const search = useSearchParts(shopId, q, filters);
  const recent = useRecentLookups(userId, shopId);
  const scanner = useScannerInput();

  const results = useMemo(() => (q && search.data ? search.data.results : []), [q, search.data]);
  const shownIds = useMemo(() => results.map((r) => r.id), [results]);
  // The highlighted row belongs to one query: a new answer starts again at the top.
  const activeIndex = active.q === q ? Math.min(active.index, Math.max(results.length - 1, 0)) : 0;

  useEffect(() => {
    inputRef.current?.focus();
    const onKey = (event: globalThis.KeyboardEvent) => {
      if (event.key !== '/' || event.ctrlKey || event.metaKey || event.altKey || typingElsewhere(event.target)) return;
      event.preventDefault();
      inputRef.current?.focus();
      inputRef.current?.select();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);

  const open = (result: Pick<PartSearchResult, 'id' | 'number' | 'description'>, query: string) => {
    recent.remember({ partId: result.id, number: result.number, description: result.description, query });
    navigate(paths.shop.part.getHref(shopId, result.id));
  };

  /**
   * Enter: open the highlighted part; if the answer on screen is not for what is typed yet, ask now.
   * A camera scan passes its code, handled like a keyboard-wedge scan.
   */
  const submit = async (camera?: { code: string }) => {
    const typed = camera ? camera.code.trim() : text.trim();
    const scanned = camera ? true : scanner.wasScanned();
    scanner.reset();
    if (!typed) return;
    let answer = results;
    let index = activeIndex;
    if (typed !== q || !search.data || search.isPlaceholderData) {
      setOpening(true);
      try {
        answer = (await queryClient.fetchQuery(searchPartsQueryOptions(shopId, typed, filters))).results;
      } catch {
        // The query on screen shows the error once the debounce catches up.
        return;
      } finally {
        setOpening(false);
      }
      index = 0;
    }
    const chosen = answer[index];
    if (!chosen) return;
    // A scanned code opens only an exact hit; anything less is shown for a person to choose.
    if (scanned && chosen.match !== 'exact') return;
    open(chosen, typed);
  };

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>) => {
    scanner.onKey(event.key);
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      if (results.length === 0) return;
      event.preventDefault();
      const step = event.key === 'ArrowDown' ? 1 : -1;
      setActive({ q, index: (activeIndex + step + results.length) % results.length });
    } else if (event.key === 'Enter') {
      event.preventDefault();
      void submit();
    } else if (event.key === 'Escape' && text) {
      event.preventDefault();
      setText('');
    }
  };

  const optionId = (index: number) => `${listId}-option-${index}`;
  const expanded = results.length > 0;

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-2">
        <label htmlFor={`${listId}-field`} className="text-lg font-bold">
          Look up a part
        </label>
        <div className="flex items-stretch gap-2">
          <div className="relative min-w-0 flex-1">
            <input
              ref={inputRef}
              id={`${listId}-field`}
              type="search"
              role="combobox"
              aria-expanded={expanded}
              aria-controls={`${listId}-results`}
              aria-autocomplete="list"
              aria-activedescendant={expanded ? optionId(activeIndex) : undefined}
              aria-describedby={`${listId}-hint`}
              autoComplete="off"
              autoCapitalize="characters"
              spellCheck={false}
              value={text}
              onChange={(event) => setText(event.target.value)}
              onKeyDown={onKeyDown}
              placeholder="Number, supplier number or words"
              className="min-h-14 w-full rounded-lg border-2 border-line-strong bg-surface px-4 py-3 font-mono font-medium text-xl text-ink placeholder:font-sans placeholder:text-ink-muted focus:border-accent focus:outline-none focus-visible:ring-2 focus-visible:ring-accent"
            />
            {(search.isFetching || opening) && (
              <Spinner size={20} className="absolute top-1/2 right-4 -translate-y-1/2 text-accent" />
            )}
          </div>
          <CameraScanButton
            label="Scan"
            aria-label="Scan with the camera"
            dialogTitle="Scan a part number"
            typeLabel="Or type the number"
            className="min-h-14"
            onDetected={(code) => {
              setText(code);
              inputRef.current?.focus();
              void submit({ code });
            }}
          />
        </div>
        <p id={`${listId}-hint`} className="text-ink-muted">
          Typos, missing prefixes and separators are forgiven. Arrow keys choose, Enter opens, “/” comes back here. Scan uses the camera of a phone or tablet.
        </p>
        <LookupFiltersPanel shopId={shopId} filters={filters} count={filterCount} onChange={setFilters} />
      </div>

      <p role="status" className="sr-only">
        {q && search.data ? `${results.length} ${results.length === 1 ? 'result' : 'results'}` : ''}
      </p>

      {!q ? (
        <RecentList items={recent.items} shopId={shopId} onOpen={(item) => open({ id: item.partId, number: item.number, description: item.description }, item.query)} onClear={recent.clear} />
      ) : search.isError && !search.data ? (
        <ErrorState title="The lookup failed" message={errorMessage(search.error)} onRetry={() => void search.refetch()} />
      ) : !search.data ? (
        <LoadingState label="Looking up…" />
      ) : (
        <>
          {search.isError && <ErrorState title="The lookup failed" message={errorMessage(search.error)} onRetry={() => void search.refetch()} />}
          {results.length === 0 ? (
            <EmptyState title={`Nothing matches “${q}”`}>
              {filterCount > 0
                ? 'Nothing matches within the filters. Clear them to look through the whole catalogue.'
                : 'Check the number against the part, leave out the prefix, or describe it in words (for example “clutch cable”).'}
            </EmptyState>
          ) : (
            <ul id={`${listId}-results`} role="listbox" aria-label="Lookup results" className={cn('flex flex-col divide-y divide-line rounded-lg border border-line bg-surface', search.isPlaceholderData && 'opacity-80')}>
              {results.map((result, index) => (
                <li key={result.id} id={optionId(index)} role="option" aria-selected={index === activeIndex} className={cn('relative', index === activeIndex && 'bg-accent-soft')}>
                  <Link
                    to={paths.shop.part.getHref(shopId, result.id)}
                    tabIndex={-1}
                    onClick={() => recent.remember({ partId: result.id, number: result.number, description: result.description, query: q })}
                    onMouseEnter={() => setActive({ q, index })}
                    className="grid min-h-14 grid-cols-[minmax(8rem,auto)_1fr] items-center gap-x-4 gap-y-1 px-4 py-2 text-ink no-underline sm:grid-cols-[minmax(9rem,auto)_1fr_auto]"
                  >
                    <PartNumber>{result.number}</PartNumber>
                    <span className="min-w-0">
                      <span className="block truncate">{result.description}</span>
                      <span className="block text-sm text-ink-muted">
                        <span className="font-bold">{matchWords[result.match]}:</span> {result.reason}
                      </span>
                      <LookupStock stock={result.stock} />
                      {resultExtra?.(result.id, shownIds)}
                    </span>
                    <span className="col-span-2 flex flex-wrap items-center gap-2 sm:col-span-1 sm:justify-end">
                      <span className="text-sm">{originWords[result.origin]}</span>
                      <StatusPill status={result.status === 'available' ? 'ok' : 'na'} label={result.status === 'available' ? 'Available' : 'No longer available'} />
                    </span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </div>
  );
}

function RecentList({ items, shopId, onOpen, onClear }: { items: RecentLookup[]; shopId: string; onOpen: (item: RecentLookup) => void; onClear: () => void }) {
  if (items.length === 0) {
    return (
      <EmptyState title="Type or scan a number">
        Part numbers, supplier numbers and description words all work. Parts you open from here are listed for next time.
      </EmptyState>
    );
  }
  return (
    <section aria-labelledby="recent-lookups" className="flex flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h2 id="recent-lookups" className="font-bold">
          Recent lookups
        </h2>
        <Button variant="secondary" size="sm" onClick={onClear}>
          Forget these
        </Button>
      </div>
      <ul className="flex flex-col divide-y divide-line rounded-lg border border-line bg-surface">
        {items.map((item) => (
          <li key={item.partId}>
            <Link
              to={paths.shop.part.getHref(shopId, item.partId)}
              onClick={(event) => {
                event.preventDefault();
                onOpen(item);
              }}
              className="flex min-h-12 flex-wrap items-center gap-x-4 px-4 py-2 text-ink no-underline hover:bg-sunk"
            >
              <PartNumber>{item.number}</PartNumber>
              <span className="min-w-0 flex-1 truncate">{item.description}</span>
              <span className="text-sm text-ink-muted">typed “{item.query}”</span>
            </Link>
          </li>
        ))}
      </ul>
    </section>
  );
}
