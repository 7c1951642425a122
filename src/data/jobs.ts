// The job list: the Jobs screen shows it; the part page offers its open jobs to install into.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobListRow } from '@shared/schemas/jobs';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

export const getJobs = (signal?: AbortSignal) => api.get<{ jobs: JobListRow[] }>('/api/jobs', { signal });

export const jobsQueryOptions = () => queryOptions({ queryKey: queryKeys.jobs.list(), queryFn: ({ signal }) => getJobs(signal) });

/** `enabled` false keeps the list unasked (the part page asks only when installing is possible). */
export const useJobs = (enabled = true) => useQuery({ ...jobsQueryOptions(), enabled });
