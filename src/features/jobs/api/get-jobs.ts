import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { JobListRow } from './types';

export const getJobs = (signal?: AbortSignal) => api.get<{ jobs: JobListRow[] }>('/api/jobs', { signal });

export const jobsQueryOptions = () => queryOptions({ queryKey: ['jobs', 'list'], queryFn: ({ signal }) => getJobs(signal) });

export const useJobs = () => useQuery(jobsQueryOptions());
