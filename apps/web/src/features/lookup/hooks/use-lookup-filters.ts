import { partOrigins, type PartOrigin } from '@tappet/contracts';
import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';

/** What a lookup can be narrowed to: the vehicle it must fit, a category, an origin. */
export interface LookupFilters {
  marque?: string;
  model?: string;
  year?: number;
  category?: string;
  origin?: PartOrigin;
}

const keys = ['marque', 'model', 'year', 'category', 'origin'] as const;

/** Reads the filters from a URL query, dropping values the API would refuse (a bad link still works). */
export function filtersFromSearch(search: URLSearchParams): LookupFilters {
  const filters: LookupFilters = {};
  const text = (key: 'marque' | 'model' | 'category', max: number) => {
    const value = search.get(key)?.trim();
    if (value && value.length <= max) filters[key] = value;
  };
  text('marque', 60);
  text('model', 80);
  text('category', 60);
  const year = Number(search.get('year'));
  if (Number.isInteger(year) && year >= 1880 && year <= 2100) filters.year = year;
  const origin = search.get('origin');
  if (origin && (partOrigins as readonly string[]).includes(origin)) filters.origin = origin as PartOrigin;
  return filters;
}

/** The filters as query parameters for GET /parts/search (only those set). */
export function filterParams(filters: LookupFilters): Record<string, string> {
  const params: Record<string, string> = {};
  for (const key of keys) {
    const value = filters[key];
    if (value !== undefined && value !== '') params[key] = String(value);
  }
  return params;
}

/**
 * The lookup's filters, kept in the page's URL so a narrowed lookup survives a reload and can be
 * bookmarked for a vehicle on the bench.
 */
export function useLookupFilters() {
  const [search, setSearch] = useSearchParams();
  const filters = useMemo(() => filtersFromSearch(search), [search]);
  const setFilters = useCallback(
    (next: LookupFilters) => {
      setSearch(
        (current) => {
          const updated = new URLSearchParams(current);
          for (const key of keys) updated.delete(key);
          for (const [key, value] of Object.entries(filterParams(next))) updated.set(key, value);
          return updated;
        },
        { replace: true },
      );
    },
    [setSearch],
  );
  const count = Object.keys(filterParams(filters)).length;
  return { filters, setFilters, count };
}
