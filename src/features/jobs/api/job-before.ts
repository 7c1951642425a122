// The wiring before the work and the job's recordings (the report's before/after clips, Listen on the job's page).
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { JobBeforeInput } from '@shared/schemas/job-clips';
import { queryKeys } from '@/data/query-keys';
import { api } from '@/lib/api-client';
import type { JobDetail } from './types';

export const setJobBefore = ({ id, input }: { id: number; input: JobBeforeInput }) => api.put<JobDetail>(`/api/jobs/${id}/before`, input);
export const useSetJobBefore = () => useMutation({ mutationFn: setJobBefore, meta: { invalidates: [queryKeys.jobs.all()] } });

export interface JobAttachment {
  id: number;
  purpose: string;
  originalName: string;
  size: number;
  createdAt: number;
}

export const jobAttachmentsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.jobs.attachments(id),
    queryFn: ({ signal }) => api.get<{ attachments: JobAttachment[] }>(`/api/jobs/${id}/attachments`, { signal }),
  });
export const useJobAttachments = (id: number) => useQuery(jobAttachmentsQueryOptions(id));

export function uploadJobRecording({ id, file }: { id: number; file: File }) {
  const form = new FormData();
  form.set('purpose', 'recording');
  form.set('file', file);
  return api.post<JobAttachment>(`/api/jobs/${id}/attachments`, form);
}
export const useUploadJobRecording = () => useMutation({ mutationFn: uploadJobRecording, meta: { invalidates: [queryKeys.jobs.all()] } });
