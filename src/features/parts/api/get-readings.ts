import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Reading } from '@/data/readings';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const getPartReadings = (id: number, signal?: AbortSignal) =>
  api.get<{ readings: Reading[] }>(`/api/parts/${id}/readings`, { signal });

/** Under the part's key, so anything that invalidates queryKeys.parts.all() refreshes it too. */
export const partReadingsQueryOptions = (id: number) =>
  queryOptions({ queryKey: queryKeys.parts.readings(id), queryFn: ({ signal }) => getPartReadings(id, signal) });

export const usePartReadings = (id: number) => useQuery(partReadingsQueryOptions(id));
