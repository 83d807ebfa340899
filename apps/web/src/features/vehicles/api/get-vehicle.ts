import { timelineResponseSchema, vehicleDetailSchema, vehicleFitmentResponseSchema, type TimelineEntry, type VehicleDetail, type VehicleFitmentResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { vehiclesApi } from './keys';

/** GET /api/shops/:shopId/vehicles/:vehicleId: the vehicle with readings, files and status history. */
export function getVehicle(shopId: string, vehicleId: string, signal?: AbortSignal): Promise<VehicleDetail> {
  return api.get(`${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}`, { schema: vehicleDetailSchema, signal });
}

export function vehicleQueryOptions(shopId: string, vehicleId: string) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'vehicles', 'detail', vehicleId), queryFn: ({ signal }) => getVehicle(shopId, vehicleId, signal) });
}

export function useVehicle(shopId: string, vehicleId: string) {
  return useQuery(vehicleQueryOptions(shopId, vehicleId));
}

/** GET …/timeline: what happened to the vehicle, newest first. */
export function timelineQueryOptions(shopId: string, vehicleId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'vehicles', 'timeline', vehicleId),
    queryFn: ({ signal }): Promise<{ entries: TimelineEntry[] }> => api.get(`${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}/timeline`, { schema: timelineResponseSchema, signal }),
  });
}

export function useTimeline(shopId: string, vehicleId: string) {
  return useQuery(timelineQueryOptions(shopId, vehicleId));
}

/** GET …/fitment: parts that fit, with free stock when the shop's stock is known. */
export function fitmentQueryOptions(shopId: string, vehicleId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'vehicles', 'fitment', vehicleId),
    queryFn: ({ signal }): Promise<VehicleFitmentResponse> => api.get(`${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}/fitment`, { schema: vehicleFitmentResponseSchema, signal }),
  });
}

export function useVehicleFitment(shopId: string, vehicleId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...fitmentQueryOptions(shopId, vehicleId), enabled: options.enabled ?? true });
}

/** The URL of a stored file (or its thumbnail), for img src and download links. */
export function fileHref(shopId: string, vehicleId: string, fileId: string, variant: 'content' | 'thumbnail' | 'download' = 'content'): string {
  const base = `/api${vehiclesApi(shopId)}/${encodeURIComponent(vehicleId)}/files/${encodeURIComponent(fileId)}`;
  if (variant === 'thumbnail') return `${base}/thumbnail`;
  return variant === 'download' ? `${base}/content?download=1` : `${base}/content`;
}
