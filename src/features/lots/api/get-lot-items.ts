import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LotItems, MatchOptions } from './types';

export const getLotItems = (id: number, match: MatchOptions, signal?: AbortSignal) =>
  api.get<LotItems>(`/api/lots/${id}/items`, { params: { ...match }, signal });

// Under ['lots','detail',id] so that anything which refreshes the lot refreshes its items too.
export const lotItemsQueryOptions = (id: number, match: MatchOptions) =>
  queryOptions({
    queryKey: ['lots', 'detail', id, 'items', match],
    queryFn: ({ signal }) => getLotItems(id, match, signal),
  });

export const useLotItems = (id: number, match: MatchOptions) =>
  useQuery({ ...lotItemsQueryOptions(id, match), placeholderData: keepPreviousData });
