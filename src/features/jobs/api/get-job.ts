import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { JobDetail, JobReport } from './types';

export const getJob = (id: number, signal?: AbortSignal) => api.get<JobDetail>(`/api/jobs/${id}`, { signal });

export const jobQueryOptions = (id: number) =>
  queryOptions({ queryKey: queryKeys.jobs.detail(id), queryFn: ({ signal }) => getJob(id, signal) });

export const useJob = (id: number) => useQuery(jobQueryOptions(id));

export const getJobReport = (id: number, signal?: AbortSignal) => api.get<JobReport>(`/api/jobs/${id}/report`, { signal });

// Under the job's key: installing or removing a part refreshes the preview too.
export const jobReportQueryOptions = (id: number) =>
  queryOptions({ queryKey: queryKeys.jobs.report(id), queryFn: ({ signal }) => getJobReport(id, signal) });

export const useJobReport = (id: number) => useQuery(jobReportQueryOptions(id));
