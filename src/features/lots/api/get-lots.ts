import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { LotListRow } from './types';

export const getLots = (signal?: AbortSignal) => api.get<{ lots: LotListRow[] }>('/api/lots', { signal });

export const lotsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.lots.list(),
    queryFn: ({ signal }) => getLots(signal),
  });

export const useLots = () => useQuery(lotsQueryOptions());
