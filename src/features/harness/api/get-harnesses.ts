import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HarnessDesign } from '@shared/schemas/harness';
import { api } from '@/lib/api-client';

export const getHarnesses = (signal?: AbortSignal) => api.get<{ harnesses: HarnessDesign[] }>('/api/harnesses', { signal });

export const harnessesQueryOptions = () =>
  queryOptions({
    queryKey: ['harnesses', 'list'],
    queryFn: ({ signal }) => getHarnesses(signal),
  });

export const useHarnesses = () => useQuery(harnessesQueryOptions());
