import type { QueryClient } from '@tanstack/react-query';
import { instrumentsQueryOptions } from '@/data/instruments';
import { profilesQueryOptions } from '@/data/profiles';
import { recentReadingsQueryOptions } from '@/features/bench/api/get-recent-readings';
import { BenchScreen } from '@/features/bench/components/bench-screen';

export const makeLoader = (queryClient: QueryClient) => async () => {
  await Promise.all([
    queryClient.ensureQueryData(recentReadingsQueryOptions()),
    queryClient.ensureQueryData(profilesQueryOptions()),
    queryClient.ensureQueryData(instrumentsQueryOptions()),
  ]);
  return null;
};

export const Component = BenchScreen;
