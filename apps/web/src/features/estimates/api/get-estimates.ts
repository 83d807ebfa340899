import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Estimate, JobApprovalState } from '@tappet/contracts';
import { api } from '../../../lib/api-client';
import { estimatesApi, estimatesKey } from './keys';

/** GET /api/shops/:shopId/estimates?jobId= — a job's estimates, newest first. */
export const jobEstimatesQueryOptions = (shopId: string, jobId: string) =>
  queryOptions({
    queryKey: [...estimatesKey(shopId), 'job', jobId],
    queryFn: ({ signal }) => api.get<{ estimates: Estimate[] }>(`${estimatesApi(shopId)}/jobs/${encodeURIComponent(jobId)}`, { signal }).then((r) => r.estimates),
  });
export const useJobEstimates = (shopId: string, jobId: string) => useQuery(jobEstimatesQueryOptions(shopId, jobId));

/** GET /api/shops/:shopId/estimates/jobs/:jobId/approval — approved amount against the job's value. */
export const approvalStateQueryOptions = (shopId: string, jobId: string) =>
  queryOptions({
    queryKey: [...estimatesKey(shopId), 'approval', jobId],
    queryFn: ({ signal }) => api.get<JobApprovalState>(`${estimatesApi(shopId)}/jobs/${encodeURIComponent(jobId)}/approval`, { signal }),
  });
export const useApprovalState = (shopId: string, jobId: string, enabled = true) => useQuery({ ...approvalStateQueryOptions(shopId, jobId), enabled });

/** The estimate as PDF, for a link. */
export const estimatePdfHref = (shopId: string, estimateId: string) => `/api${estimatesApi(shopId)}/${encodeURIComponent(estimateId)}/pdf`;
