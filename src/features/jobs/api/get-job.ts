import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys, type JobReportOptions } from '@/data/query-keys';
import type { JobDetail, JobReport } from './types';

export const getJob = (id: number, signal?: AbortSignal) => api.get<JobDetail>(`/api/jobs/${id}`, { signal });

export const jobQueryOptions = (id: number) =>
  queryOptions({ queryKey: queryKeys.jobs.detail(id), queryFn: ({ signal }) => getJob(id, signal) });

export const useJob = (id: number) => useQuery(jobQueryOptions(id));

/** What the e-mail will carry besides the job: the address typed (else the customer's) and the shop's note. */
export type { JobReportOptions };

export const getJobReport = (id: number, opts: JobReportOptions = {}, signal?: AbortSignal) =>
  api.get<JobReport>(`/api/jobs/${id}/report`, { params: opts, signal });

export const jobReportQueryOptions = (id: number, opts: JobReportOptions = {}) =>
  queryOptions({
    queryKey: queryKeys.jobs.report(id, opts),
    queryFn: ({ signal }) => getJobReport(id, opts, signal),
    placeholderData: (previous) => previous,
  });

export const useJobReport = (id: number, opts: JobReportOptions = {}) => useQuery(jobReportQueryOptions(id, opts));
