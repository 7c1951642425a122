import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CompareCandidates } from './types';

export const getCompareCandidates = (signal?: AbortSignal) => api.get<CompareCandidates>('/api/compare/candidates', { signal });

export const compareCandidatesQueryOptions = () =>
  queryOptions({
    queryKey: ['compare', 'candidates'],
    queryFn: ({ signal }) => getCompareCandidates(signal),
  });

export const useCompareCandidates = () => useQuery(compareCandidatesQueryOptions());
