import { jobListResponseSchema, type JobListResponse } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { jobsApi } from './keys';

/** Which jobs a list shows: the caller's own, or the whole board; closed ones on request. */
export interface JobListParams {
  mine: boolean;
  closed: boolean;
  vehicleId?: string;
}

/** GET /api/shops/:shopId/jobs: newest first. */
export function getJobs(shopId: string, params: JobListParams, signal?: AbortSignal): Promise<JobListResponse> {
  const search = new URLSearchParams();
  if (params.mine) search.set('assignee', 'me');
  if (params.closed) search.set('closed', 'true');
  if (params.vehicleId) search.set('vehicleId', params.vehicleId);
  const qs = search.toString();
  return api.get(`${jobsApi(shopId)}${qs ? `?${qs}` : ''}`, { schema: jobListResponseSchema, signal });
}

export function jobsQueryOptions(shopId: string, params: JobListParams) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'jobs', 'list', params), queryFn: ({ signal }) => getJobs(shopId, params, signal) });
}

export function useJobs(shopId: string, params: JobListParams) {
  return useQuery(jobsQueryOptions(shopId, params));
}
