import { partOrigins, partStatuses, type PartOrigin, type PartStatusValue } from '@tappet/contracts';
import { useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { partListSearch, type PartListParams } from '../api/get-parts';

/** Rows a page on the catalogue list. */
export const catalogueListPageSize = 25;

/** Reads the list's filters from a query string, dropping values the API would refuse. */
export function parsePartListParams(search: URLSearchParams): PartListParams {
  const origin = search.get('origin');
  const status = search.get('status');
  const page = Number(search.get('page'));
  return {
    q: search.get('q')?.trim().slice(0, 100) || undefined,
    category: search.get('category')?.trim().slice(0, 60) || undefined,
    origin: partOrigins.includes(origin as PartOrigin) ? (origin as PartOrigin) : undefined,
    status: partStatuses.includes(status as PartStatusValue) ? (status as PartStatusValue) : undefined,
    problemsOnly: search.get('problemsOnly') === 'true' || undefined,
    page: Number.isInteger(page) && page > 1 ? page : 1,
    pageSize: catalogueListPageSize,
  };
}

/**
 * The catalogue list's filters live in the URL, so a filtered view can be bookmarked, shared and
 * reached again with the back button. Changing a filter goes back to page 1.
 */
export function usePartListParams() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => parsePartListParams(search), [search]);
  function update(change: Partial<PartListParams>) {
    const next: PartListParams = { ...params, ...change };
    if (!('page' in change)) next.page = 1;
    // The page size is fixed by the screen; keep it out of the address.
    setSearch(partListSearch({ ...next, pageSize: undefined }));
  }
  const filtered = Boolean(params.q || params.category || params.origin || params.status || params.problemsOnly);
  return { params, update, filtered, clear: () => setSearch('') };
}
