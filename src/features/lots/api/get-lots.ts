import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LotListRow } from './types';

export const getLots = (signal?: AbortSignal) => api.get<{ lots: LotListRow[] }>('/api/lots', { signal });

export const lotsQueryOptions = () =>
  queryOptions({
    queryKey: ['lots', 'list'],
    queryFn: ({ signal }) => getLots(signal),
  });

export const useLots = () => useQuery(lotsQueryOptions());
