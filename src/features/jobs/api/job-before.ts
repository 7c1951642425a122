// The wiring before the work and the job's recordings (the report's before/after clips, Listen on the job's page).
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { JobBeforeInput } from '@shared/schemas/job-clips';
import { api } from '@/lib/api-client';
import type { JobDetail } from './types';

export const setJobBefore = ({ id, input }: { id: number; input: JobBeforeInput }) => api.put<JobDetail>(`/api/jobs/${id}/before`, input);
export const useSetJobBefore = () => useMutation({ mutationFn: setJobBefore, meta: { invalidates: [['jobs']] } });

export interface JobAttachment {
  id: number;
  purpose: string;
  originalName: string;
  size: number;
  createdAt: number;
}

export const jobAttachmentsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['jobs', 'detail', id, 'attachments'],
    queryFn: ({ signal }) => api.get<{ attachments: JobAttachment[] }>(`/api/jobs/${id}/attachments`, { signal }),
  });
export const useJobAttachments = (id: number) => useQuery(jobAttachmentsQueryOptions(id));

export function uploadJobRecording({ id, file }: { id: number; file: File }) {
  const form = new FormData();
  form.set('purpose', 'recording');
  form.set('file', file);
  return api.post<JobAttachment>(`/api/jobs/${id}/attachments`, form);
}
export const useUploadJobRecording = () => useMutation({ mutationFn: uploadJobRecording, meta: { invalidates: [['jobs']] } });
