import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HarnessDesign } from '@shared/schemas/harness';
import { queryKeys } from '@/data/query-keys';
import { api } from '@/lib/api-client';

export const getHarness = (id: number, signal?: AbortSignal) => api.get<HarnessDesign>(`/api/harnesses/${id}`, { signal });

export const harnessQueryOptions = (id: number) =>
  queryOptions({ queryKey: queryKeys.harnesses.detail(id), queryFn: ({ signal }) => getHarness(id, signal) });

export const useHarness = (id: number) => useQuery(harnessQueryOptions(id));
