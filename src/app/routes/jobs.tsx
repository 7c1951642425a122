import type { QueryClient } from '@tanstack/react-query';
import { jobsQueryOptions } from '@/data/jobs';
import { JobsScreen } from '@/features/jobs/components/jobs-screen';

export const makeLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(jobsQueryOptions());
  return null;
};

export const Component = JobsScreen;
