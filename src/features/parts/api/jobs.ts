// The part page's own view of jobs: the open ones to install into, and the install call.
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export type JobSummary = {
  id: number;
  code: string;
  customer: string;
  instrument: string;
  status: 'open' | 'done' | 'delivered';
  partCount: number;
};

export const jobsQueryOptions = () =>
  queryOptions({ queryKey: ['jobs', 'list'], queryFn: ({ signal }) => api.get<{ jobs: JobSummary[] }>('/api/jobs', { signal }) });
export const useJobs = (enabled: boolean) => useQuery({ ...jobsQueryOptions(), enabled });

export const installPart = ({ jobId, partId, position }: { jobId: number; partId: number; position: string }) =>
  api.post<unknown>(`/api/jobs/${jobId}/parts`, { partId, position });

export const useInstallPart = () => useMutation({ mutationFn: installPart, meta: { invalidates: [['parts'], ['jobs']] } });
