import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { LotItems, MatchOptions } from './types';

export const getLotItems = (id: number, match: MatchOptions, signal?: AbortSignal) =>
  api.get<LotItems>(`/api/lots/${id}/items`, { params: { ...match }, signal });

export const lotItemsQueryOptions = (id: number, match: MatchOptions) =>
  queryOptions({
    queryKey: queryKeys.lots.items(id, match),
    queryFn: ({ signal }) => getLotItems(id, match, signal),
  });

export const useLotItems = (id: number, match: MatchOptions) =>
  useQuery({ ...lotItemsQueryOptions(id, match), placeholderData: keepPreviousData });
