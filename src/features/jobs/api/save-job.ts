import { useMutation } from '@tanstack/react-query';
import type { CreateJobInput, UpdateJobInput } from '@shared/schemas/jobs';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { Job, JobDetail } from './types';

export const createJob = (input: CreateJobInput) => api.post<Job>('/api/jobs', input);
export const updateJob = ({ id, input }: { id: number; input: UpdateJobInput }) => api.patch<JobDetail>(`/api/jobs/${id}`, input);

export const useCreateJob = () => useMutation({ mutationFn: createJob, meta: { invalidates: [queryKeys.jobs.all()] } });
export const useUpdateJob = () => useMutation({ mutationFn: updateJob, meta: { invalidates: [queryKeys.jobs.all()] } });
