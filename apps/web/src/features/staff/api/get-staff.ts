import { staffListResponseSchema, type StaffListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { staffKeys } from './keys';

/** GET /api/shops/:shopId/staff: members (active and deactivated) and open invitations. */
export function getStaff(shopId: string, signal?: AbortSignal): Promise<StaffListResponse> {
  return api.get(`/shops/${encodeURIComponent(shopId)}/staff`, { schema: staffListResponseSchema, signal });
}

export function staffQueryOptions(shopId: string) {
  return queryOptions({ queryKey: staffKeys.list(shopId), queryFn: ({ signal }) => getStaff(shopId, signal) });
}

export function useStaff(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...staffQueryOptions(shopId), enabled: options.enabled ?? true });
}
