// Parts as several features read them: the list (Parts screen, the Harness screen's measured-part
// chooser), one part's page data (Parts; the Harness screen shows a saved design's part label),
// its fits (the part page; the Harness and Compare choosers), and the one call that creates a part
// (the Bench's quick form and the Parts screen's form).
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { CreatePartInput, Part, PartDetail } from '@shared/schemas/parts';
import type { Fit } from '@shared/schemas/sweeps';
import { api } from '@/lib/api-client';
import { queryKeys, type PartFilters } from './query-keys';

export type { PartFilters } from './query-keys';

export const getParts = (filters: PartFilters, signal?: AbortSignal) =>
  api.get<{ parts: Part[] }>('/api/parts', { params: filters, signal });

export const partsQueryOptions = (filters: PartFilters = {}) =>
  queryOptions({
    queryKey: queryKeys.parts.list(filters),
    queryFn: ({ signal }) => getParts(filters, signal),
  });

export const getPart = (id: number, signal?: AbortSignal) => api.get<PartDetail>(`/api/parts/${id}`, { signal });

export const partQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.parts.detail(id),
    queryFn: ({ signal }) => getPart(id, signal),
  });

export const usePart = (id: number) => useQuery(partQueryOptions(id));

export const partFitsQueryOptions = (partId: number) =>
  queryOptions({
    queryKey: queryKeys.parts.fits(partId),
    queryFn: ({ signal }) => api.get<{ fits: Fit[] }>(`/api/parts/${partId}/fits`, { signal }),
  });

export const useFits = (partId: number) => useQuery(partFitsQueryOptions(partId));

export const createPart = (input: CreatePartInput) => api.post<Part>('/api/parts', input);

export const useCreatePart = () => useMutation({ mutationFn: createPart, meta: { invalidates: [queryKeys.parts.all()] } });
