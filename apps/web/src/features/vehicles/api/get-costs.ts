import { vehicleCostsSchema, type VehicleCosts } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { vehiclesApi } from './keys';

/** GET …/vehicles/:vehicleId/costs: acquisition + every job's cost against the asking price. */
export function getVehicleCosts(shopId: string, vehicleId: string, signal?: AbortSignal): Promise<VehicleCosts> {
  return api.get(`${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}/costs`, { schema: vehicleCostsSchema, signal });
}

export function vehicleCostsQueryOptions(shopId: string, vehicleId: string) {
  // Under the jobs key too would be neater, but job writes invalidate `jobs` only: refetch on mount instead.
  return queryOptions({ queryKey: shopQueryKey(shopId, 'vehicles', 'costs', vehicleId), queryFn: ({ signal }) => getVehicleCosts(shopId, vehicleId, signal), staleTime: 0 });
}

export function useVehicleCosts(shopId: string, vehicleId: string, enabled: boolean) {
  return useQuery({ ...vehicleCostsQueryOptions(shopId, vehicleId), enabled });
}
