import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Reading } from '@/components/readings/api';
import { api } from '@/lib/api-client';

export const getPartReadings = (id: number, signal?: AbortSignal) =>
  api.get<{ readings: Reading[] }>(`/api/parts/${id}/readings`, { signal });

/** Under the part's key, so anything that invalidates ['parts'] refreshes it too. */
export const partReadingsQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['parts', 'detail', id, 'readings'], queryFn: ({ signal }) => getPartReadings(id, signal) });

export const usePartReadings = (id: number) => useQuery(partReadingsQueryOptions(id));
