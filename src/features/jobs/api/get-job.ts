import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { JobDetail, JobReport } from './types';

export const getJob = (id: number, signal?: AbortSignal) => api.get<JobDetail>(`/api/jobs/${id}`, { signal });

export const jobQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['jobs', 'detail', id], queryFn: ({ signal }) => getJob(id, signal) });

export const useJob = (id: number) => useQuery(jobQueryOptions(id));

/** What the e-mail will carry besides the job: the address typed (else the customer's) and the shop's note. */
export type JobReportOptions = { to?: string; message?: string };

export const getJobReport = (id: number, opts: JobReportOptions = {}, signal?: AbortSignal) =>
  api.get<JobReport>(`/api/jobs/${id}/report`, { params: opts, signal });

// Under the job's key: installing, removing or assigning a part refreshes the preview too.
export const jobReportQueryOptions = (id: number, opts: JobReportOptions = {}) =>
  queryOptions({
    queryKey: ['jobs', 'detail', id, 'report', opts],
    queryFn: ({ signal }) => getJobReport(id, opts, signal),
    placeholderData: (previous) => previous,
  });

export const useJobReport = (id: number, opts: JobReportOptions = {}) => useQuery(jobReportQueryOptions(id, opts));
