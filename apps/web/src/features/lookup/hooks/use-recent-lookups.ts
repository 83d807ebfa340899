import { useCallback, useState } from 'react';

/** A part opened from the lookup, remembered for the next time. */
export interface RecentLookup {
  partId: string;
  number: string;
  description: string;
  /** What was typed to find it. */
  query: string;
}

/** How many recent lookups are kept. */
export const RECENT_LIMIT = 8;

/** The storage key: one list per person and shop, so a shared bench tablet keeps people apart. */
export function recentLookupsKey(userId: string, shopId: string): string {
  return `tappet.lookup.recent.${userId}.${shopId}`;
}

function read(key: string): RecentLookup[] {
  try {
    const parsed: unknown = JSON.parse(localStorage.getItem(key) ?? '[]');
    if (!Array.isArray(parsed)) return [];
    // Stored data is untrusted: keep only well-formed entries.
    return parsed
      .filter((e): e is RecentLookup => typeof e === 'object' && e !== null && ['partId', 'number', 'description', 'query'].every((k) => typeof (e as Record<string, unknown>)[k] === 'string'))
      .slice(0, RECENT_LIMIT);
  } catch {
    return [];
  }
}

/** The person's recent lookups in this shop (localStorage), newest first, and a way to add one. */
export function useRecentLookups(userId: string, shopId: string) {
  const key = recentLookupsKey(userId, shopId);
  const [state, setState] = useState(() => ({ key, items: read(key) }));
  // A different person or shop: read their list (state derived from props, no effect needed).
  const items = state.key === key ? state.items : read(key);
  if (state.key !== key) setState({ key, items });

  const remember = useCallback(
    (entry: RecentLookup) => {
      const next = [entry, ...read(key).filter((e) => e.partId !== entry.partId)].slice(0, RECENT_LIMIT);
      try {
        localStorage.setItem(key, JSON.stringify(next));
      } catch {
        // Storage full or blocked (private mode): the list simply is not remembered.
      }
      setState({ key, items: next });
    },
    [key],
  );

  const clear = useCallback(() => {
    try {
      localStorage.removeItem(key);
    } catch {
      // Nothing to do: the list is gone from the screen either way.
    }
    setState({ key, items: [] });
  }, [key]);

  return { items, remember, clear };
}
