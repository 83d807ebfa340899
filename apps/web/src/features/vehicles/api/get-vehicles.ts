import { vehicleListResponseSchema, type VehicleKind, type VehicleListResponse, type VehicleStatus } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { vehiclesApi } from './keys';

/** The list's filters and page, as the screen holds them (and the URL carries them). */
export interface VehicleListParams {
  kind?: VehicleKind;
  status?: VehicleStatus;
  marque?: string;
  q?: string;
  page?: number;
}

/** The query string for GET /vehicles: only the filters that are set. */
export function vehicleListSearch(params: VehicleListParams): string {
  const search = new URLSearchParams();
  if (params.kind) search.set('kind', params.kind);
  if (params.status) search.set('status', params.status);
  if (params.marque) search.set('marque', params.marque);
  if (params.q) search.set('q', params.q);
  if (params.page && params.page > 1) search.set('page', String(params.page));
  return search.toString();
}

/** GET /api/shops/:shopId/vehicles: one page of the shop's vehicles, filtered. */
export function getVehicles(shopId: string, params: VehicleListParams, signal?: AbortSignal): Promise<VehicleListResponse> {
  const search = vehicleListSearch(params);
  return api.get(`${vehiclesApi(shopId)}${search ? `?${search}` : ''}`, { schema: vehicleListResponseSchema, signal });
}

export function vehiclesQueryOptions(shopId: string, params: VehicleListParams) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'vehicles', 'list', params),
    queryFn: ({ signal }) => getVehicles(shopId, params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useVehicles(shopId: string, params: VehicleListParams) {
  return useQuery(vehiclesQueryOptions(shopId, params));
}
