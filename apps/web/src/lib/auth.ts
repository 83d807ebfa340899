import type { MeWithActiveShop } from '@tappet/contracts';
import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { ApiError, api } from './api-client';
import { meSchema } from './me-schema';

/** /api/me's check: by hand, so the first screen does not wait for zod (docs/decisions/024-mobile-first-load.md). */
export { meSchema };

/** /api/me: the person, their memberships and the session's active shop. */
export type Me = MeWithActiveShop;
export type MembershipView = Me['memberships'][number];

export const meQueryKey = ['me'] as const;

/** Who is signed in, or null when nobody is (401). */
export async function getMe(): Promise<Me | null> {
  try {
    return await api.get('/me', { schema: meSchema });
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({ queryKey: meQueryKey, queryFn: getMe, staleTime: 60_000 });
}

/** The me payload; inside the signed-in part of the app it has been loaded by the route. */
export function useMe(): Me | null {
  return useSuspenseQuery(meQueryOptions()).data;
}

/** The shop the person is working in when the URL does not name one. */
export function defaultShopId(me: Me): string | null {
  const own = me.memberships.filter((m) => !isSupportAccess(m));
  if (me.activeShopId && own.some((m) => m.shopId === me.activeShopId)) return me.activeShopId;
  return own[0]?.shopId ?? null;
}

/** A platform admin's entry for a shop whose owner granted support access (not a membership). */
export function isSupportAccess(m: MembershipView): boolean {
  return m.supportUntil != null;
}

/** Where a signed-in person starts: their shop's home, the platform page, or the no-shop page. */
export function homeHref(me: Me): string {
  const shopId = defaultShopId(me);
  if (shopId) return `/shops/${encodeURIComponent(shopId)}`;
  return me.user.isPlatformAdmin ? '/platform' : '/welcome';
}
