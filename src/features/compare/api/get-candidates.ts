import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CompareCandidates } from './types';
import { queryKeys } from '@/data/query-keys';

export const getCompareCandidates = (signal?: AbortSignal) => api.get<CompareCandidates>('/api/compare/candidates', { signal });

export const compareCandidatesQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.compare.candidates(),
    queryFn: ({ signal }) => getCompareCandidates(signal),
  });

export const useCompareCandidates = () => useQuery(compareCandidatesQueryOptions());
