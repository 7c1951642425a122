import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SavedComparison } from './types';
import { queryKeys } from '@/data/query-keys';

export const getComparisons = (signal?: AbortSignal) => api.get<{ comparisons: SavedComparison[] }>('/api/comparisons', { signal });

export const comparisonsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.comparisons.list(),
    queryFn: ({ signal }) => getComparisons(signal),
  });

export const useComparisons = () => useQuery(comparisonsQueryOptions());

export const getComparison = (id: number, signal?: AbortSignal) => api.get<SavedComparison>(`/api/comparisons/${id}`, { signal });

export const comparisonQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.comparisons.detail(id),
    queryFn: ({ signal }) => getComparison(id, signal),
  });

export const useComparison = (id: number | null) => useQuery({ ...comparisonQueryOptions(id ?? 0), enabled: id !== null });
