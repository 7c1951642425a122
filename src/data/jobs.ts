// The job list (the Jobs screen shows it; the part page offers its open jobs to install into) and
// installing a part into a job, which both the job page and the part page do.
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { InstallPartInput, JobDetail, JobListRow } from '@shared/schemas/jobs';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

export const getJobs = (signal?: AbortSignal) => api.get<{ jobs: JobListRow[] }>('/api/jobs', { signal });

export const jobsQueryOptions = () => queryOptions({ queryKey: queryKeys.jobs.list(), queryFn: ({ signal }) => getJobs(signal) });

/** `enabled` false keeps the list unasked (the part page asks only when installing is possible). */
export const useJobs = (enabled = true) => useQuery({ ...jobsQueryOptions(), enabled });

export const installPart = ({ id, input }: { id: number; input: InstallPartInput }) => api.post<JobDetail>(`/api/jobs/${id}/parts`, input);

// Installing changes the part's status too: the parts lists go stale.
export const useInstallPart = () =>
  useMutation({ mutationFn: installPart, meta: { invalidates: [queryKeys.jobs.all(), queryKeys.parts.all()] } });
