import {
  planListResponseSchema,
  planSchema,
  platformShopListResponseSchema,
  platformShopSchema,
  shopStateChangeResponseSchema,
  type CreatePlanRequest,
  type OnboardShopRequest,
  type PlatformShopListQuery,
  type UpdatePlanRequest,
} from '@tappet/contracts';
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** Query keys of the platform console (no shop prefix: platform data belongs to no shop). */
export const platformKeys = {
  all: ['platform'] as const,
  shops: (query: PlatformShopListQuery) => ['platform', 'shops', query] as const,
  plans: ['platform', 'plans'] as const,
};

function shopsPath(query: PlatformShopListQuery): string {
  const search = new URLSearchParams();
  if (query.q) search.set('q', query.q);
  if (query.state) search.set('state', query.state);
  if (query.planId) search.set('planId', query.planId);
  const s = search.toString();
  return `/platform/shops${s ? `?${s}` : ''}`;
}

/** GET /api/platform/shops: every shop with plan, state and usage, searched and filtered. */
export function platformShopsQueryOptions(query: PlatformShopListQuery) {
  return queryOptions({ queryKey: platformKeys.shops(query), queryFn: ({ signal }) => api.get(shopsPath(query), { schema: platformShopListResponseSchema, signal }) });
}

export function usePlatformShops(query: PlatformShopListQuery) {
  // The old list stays on screen while a new search loads.
  return useQuery({ ...platformShopsQueryOptions(query), placeholderData: keepPreviousData });
}

/** GET /api/platform/plans: every plan, active or retired. */
export function platformPlansQueryOptions() {
  return queryOptions({ queryKey: platformKeys.plans, queryFn: ({ signal }) => api.get('/platform/plans', { schema: planListResponseSchema, signal }) });
}

export function usePlatformPlans() {
  return useQuery(platformPlansQueryOptions());
}

function useInvalidatingMutation<I, O>(fn: (input: I) => Promise<O>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => queryClient.invalidateQueries({ queryKey: platformKeys.all }) });
}

/** POST /api/platform/shops: onboard a shop and invite its owner. */
export function useOnboardShop() {
  return useInvalidatingMutation((input: OnboardShopRequest) => api.post('/platform/shops', input, { schema: platformShopSchema }));
}

/** POST /api/platform/shops/:id/suspend or /reactivate, with a reason. */
export function useChangeShopState() {
  return useInvalidatingMutation((input: { shopId: string; to: 'suspend' | 'reactivate'; reason: string }) =>
    api.post(`/platform/shops/${encodeURIComponent(input.shopId)}/${input.to}`, { reason: input.reason }, { schema: shopStateChangeResponseSchema }),
  );
}

/** POST /api/platform/plans. */
export function useCreatePlan() {
  return useInvalidatingMutation((input: CreatePlanRequest) => api.post('/platform/plans', input, { schema: planSchema }));
}

/** PATCH /api/platform/plans/:id. */
export function useUpdatePlan() {
  return useInvalidatingMutation((input: { planId: string; patch: UpdatePlanRequest }) => api.patch(`/platform/plans/${encodeURIComponent(input.planId)}`, input.patch, { schema: planSchema }));
}
