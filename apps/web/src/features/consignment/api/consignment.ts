import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ConsignmentListRow, ConsignmentTermsInput, ConsignmentVehicle, PayoutInput, SettlementInput } from '@tappet/contracts';
import { api, apiRequest } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

const base = (shopId: string) => `/shops/${encodeURIComponent(shopId)}/consignment`;
const vehicle = (shopId: string, vehicleId: string) => `${base(shopId)}/vehicles/${encodeURIComponent(vehicleId)}`;
export const consignmentKey = (shopId: string) => shopQueryKey(shopId, 'consignment');

/** GET /api/shops/:shopId/consignment/vehicles */
export const consignmentListQueryOptions = (shopId: string) =>
  queryOptions({ queryKey: [...consignmentKey(shopId), 'list'], queryFn: ({ signal }) => api.get<{ vehicles: ConsignmentListRow[] }>(`${base(shopId)}/vehicles`, { signal }).then((r) => r.vehicles) });
export const useConsignmentList = (shopId: string) => useQuery(consignmentListQueryOptions(shopId));

/** GET /api/shops/:shopId/consignment/vehicles/:vehicleId */
export const consignmentVehicleQueryOptions = (shopId: string, vehicleId: string) =>
  queryOptions({ queryKey: [...consignmentKey(shopId), 'vehicle', vehicleId], queryFn: ({ signal }) => api.get<ConsignmentVehicle>(vehicle(shopId, vehicleId), { signal }) });
export const useConsignmentVehicle = (shopId: string, vehicleId: string) => useQuery(consignmentVehicleQueryOptions(shopId, vehicleId));

export const settlementPdfHref = (shopId: string, vehicleId: string) => `/api${vehicle(shopId, vehicleId)}/settlement/pdf`;

export const saveTerms = (shopId: string, input: { vehicleId: string; terms: ConsignmentTermsInput }) => apiRequest<ConsignmentVehicle>(`${vehicle(shopId, input.vehicleId)}/terms`, { method: 'PUT', body: input.terms });
export const settle = (shopId: string, input: { vehicleId: string; body: SettlementInput }) => api.post<ConsignmentVehicle>(`${vehicle(shopId, input.vehicleId)}/settlement`, input.body);
export const recordPayout = (shopId: string, input: { vehicleId: string; body: PayoutInput }) => api.post<ConsignmentVehicle>(`${vehicle(shopId, input.vehicleId)}/settlement/payout`, input.body);

/** A consignment write that refreshes the shop's consignment queries when it succeeds. */
export function useConsignmentMutation<I, R>(shopId: string, write: (shopId: string, input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: (input: I) => write(shopId, input), onSuccess: () => queryClient.invalidateQueries({ queryKey: consignmentKey(shopId) }) });
}
