import {
  jobDetailSchema,
  jobFilesResponseSchema,
  type JobDetail,
  type JobFile,
  type JobHoldInput,
  type JobInput,
  type JobIssueInput,
  type JobReturnInput,
  type JobStatusMove,
  type JobUpdate,
  type LabourInput,
  type RecordItemInput,
  type SignOffInput,
  type SpecialOrderInput,
} from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, apiRequest } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { jobsApi, jobsKey } from './keys';

const one = (shopId: string, jobId: string) => `${jobsApi(shopId)}/${encodeURIComponent(jobId)}`;

/** After a change: the job's new state goes straight into the cache, lists and stock refresh. */
function useSettle(shopId: string, jobId?: string) {
  const queryClient = useQueryClient();
  return (job: JobDetail) => {
    queryClient.setQueryData(shopQueryKey(shopId, 'jobs', 'detail', jobId ?? job.id), job);
    void queryClient.invalidateQueries({ queryKey: jobsKey(shopId) });
    void queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'stock') });
  };
}

/** POST /jobs: opens a job (owner). */
export function useCreateJob(shopId: string) {
  const settle = useSettle(shopId);
  return useMutation({ mutationFn: (input: JobInput): Promise<JobDetail> => api.post(jobsApi(shopId), input, { schema: jobDetailSchema }), onSuccess: settle });
}

/** One mutation per job write; each answers with the whole job. */
function useJobWrite<I>(shopId: string, jobId: string, send: (input: I) => Promise<JobDetail>) {
  const settle = useSettle(shopId, jobId);
  return useMutation({ mutationFn: send, onSuccess: settle });
}

export function useUpdateJob(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (patch: JobUpdate) => api.patch(one(shopId, jobId), patch, { schema: jobDetailSchema }));
}

export function useMoveJob(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (move: JobStatusMove) => api.post(`${one(shopId, jobId)}/status`, move, { schema: jobDetailSchema }));
}

export function useStartChecklist(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (templateId: string) => api.post(`${one(shopId, jobId)}/checklists`, { templateId }, { schema: jobDetailSchema }));
}

export function useRecordItem(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, ({ checklistId, itemKey, input }: { checklistId: string; itemKey: string; input: RecordItemInput }) =>
    apiRequest(`${one(shopId, jobId)}/checklists/${encodeURIComponent(checklistId)}/items/${encodeURIComponent(itemKey)}`, { method: 'PUT', body: input, schema: jobDetailSchema }),
  );
}

export function useCompleteChecklist(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (checklistId: string) => api.post(`${one(shopId, jobId)}/checklists/${encodeURIComponent(checklistId)}/complete`, undefined, { schema: jobDetailSchema }));
}

export function useSignOff(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: SignOffInput) => api.post(`${one(shopId, jobId)}/sign-offs`, input, { schema: jobDetailSchema }));
}

export function useHoldPart(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: JobHoldInput) => api.post(`${one(shopId, jobId)}/parts/holds`, input, { schema: jobDetailSchema }));
}

export function useIssuePart(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: JobIssueInput) => api.post(`${one(shopId, jobId)}/parts/issues`, input, { schema: jobDetailSchema }));
}

export function useReturnPart(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: JobReturnInput) => api.post(`${one(shopId, jobId)}/parts/returns`, input, { schema: jobDetailSchema }));
}

export function useReleaseHold(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (holdId: string) => api.post(`${one(shopId, jobId)}/parts/holds/${encodeURIComponent(holdId)}/release`, undefined, { schema: jobDetailSchema }));
}

export function useAddSpecialOrder(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: SpecialOrderInput) => api.post(`${one(shopId, jobId)}/special-orders`, input, { schema: jobDetailSchema }));
}

export function useAddLabour(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (input: LabourInput) => api.post(`${one(shopId, jobId)}/labour`, input, { schema: jobDetailSchema }));
}

export function useRemoveLabour(shopId: string, jobId: string) {
  return useJobWrite(shopId, jobId, (entryId: string) => api.delete(`${one(shopId, jobId)}/labour/${encodeURIComponent(entryId)}`, { schema: jobDetailSchema }));
}

/** POST …/files (multipart): photos of the job, re-encoded by the API; answers with the new files. */
export function useUploadJobPhotos(shopId: string, jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ files, caption }: { files: File[]; caption?: string }): Promise<JobFile[]> => {
      const form = new FormData();
      if (caption) form.append('caption', caption);
      for (const file of files) form.append('files', file, file.name);
      const res = await api.post(`${one(shopId, jobId)}/files`, form, { schema: jobFilesResponseSchema });
      return res.files;
    },
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'jobs', 'detail', jobId) }),
  });
}
