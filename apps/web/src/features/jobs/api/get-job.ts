import { jobDetailSchema, type JobDetail } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { jobsApi } from './keys';

/** GET /api/shops/:shopId/jobs/:jobId: the job with checklists, parts, labour and cost. */
export function getJob(shopId: string, jobId: string, signal?: AbortSignal): Promise<JobDetail> {
  return api.get(`${jobsApi(shopId)}/${encodeURIComponent(jobId)}`, { schema: jobDetailSchema, signal });
}

export function jobQueryOptions(shopId: string, jobId: string) {
  return queryOptions({ queryKey: shopQueryKey(shopId, 'jobs', 'detail', jobId), queryFn: ({ signal }) => getJob(shopId, jobId, signal) });
}

export function useJob(shopId: string, jobId: string) {
  return useQuery(jobQueryOptions(shopId, jobId));
}

/** The URL of a job photo or its thumbnail. */
export function jobFileHref(shopId: string, jobId: string, fileId: string, variant: 'content' | 'thumbnail' = 'thumbnail'): string {
  return `/api${jobsApi(shopId)}/${encodeURIComponent(jobId)}/files/${encodeURIComponent(fileId)}/${variant}`;
}

/** The URL of the job's printable sheet (PDF). */
export function jobSheetHref(shopId: string, jobId: string): string {
  return `/api${jobsApi(shopId)}/${encodeURIComponent(jobId)}/sheet.pdf`;
}
