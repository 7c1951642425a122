// Saved harness designs: the Harness screen saves and opens them; a job points to one.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HarnessDesign } from '@shared/schemas/harness';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

export const getHarnesses = (signal?: AbortSignal) => api.get<{ harnesses: HarnessDesign[] }>('/api/harnesses', { signal });

export const harnessesQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.harnesses.list(),
    queryFn: ({ signal }) => getHarnesses(signal),
  });

export const useHarnesses = () => useQuery(harnessesQueryOptions());
