import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { LotDetail, MatchOptions } from './types';

export const getLot = (id: number, match: MatchOptions, signal?: AbortSignal) =>
  api.get<LotDetail>(`/api/lots/${id}`, { params: { ...match }, signal });

export const lotQueryOptions = (id: number, match: MatchOptions) =>
  queryOptions({
    queryKey: queryKeys.lots.detail(id, match),
    queryFn: ({ signal }) => getLot(id, match, signal),
  });

/** Keeps the last answer on screen while another match percentage or set size is computed. */
export const useLot = (id: number, match: MatchOptions) => useQuery({ ...lotQueryOptions(id, match), placeholderData: keepPreviousData });
