import { QueryCache, QueryClient, type QueryKey } from '@tanstack/react-query';
import { ApiError } from './api-client';
import { meQueryKey } from './auth';

/**
 * Query keys for shop data always start with ['shops', shopId], so one shop's cache can be
 * dropped whole and never shows up in another shop.
 */
export function shopQueryKey<const T extends readonly unknown[]>(shopId: string, ...rest: T) {
  return ['shops', shopId, ...rest] as const;
}

function shopIdOf(key: QueryKey): string | null {
  return key[0] === 'shops' && typeof key[1] === 'string' ? key[1] : null;
}

/** Drops every cached query of every shop except `keepShopId` (all shops when null). */
export function clearShopCaches(queryClient: QueryClient, keepShopId: string | null = null): void {
  queryClient.removeQueries({
    predicate: (query) => {
      const shopId = shopIdOf(query.queryKey);
      return shopId !== null && shopId !== keepShopId;
    },
  });
}

/** The app's QueryClient: no retries on 4xx, and a 401 anywhere means "signed out". */
export function createQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        // The session ended (idle time-out, signed out elsewhere): the signed-in layout sees
        // me = null and sends the person to the sign-in page.
        if (error instanceof ApiError && error.status === 401 && query.queryKey[0] !== meQueryKey[0]) {
          queryClient.setQueryData(meQueryKey, null);
        }
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) => {
          if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
      },
      mutations: { retry: false },
    },
  });
  return queryClient;
}
