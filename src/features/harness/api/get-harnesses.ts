import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HarnessPresetId } from '@shared/circuit/presets';
import type { HarnessValuesInput } from '@shared/schemas/harness';
import { api } from '@/lib/api-client';

/** A saved harness design as the server stores it (GET /api/harnesses). */
export interface HarnessDesign {
  id: number;
  name: string;
  preset: HarnessPresetId;
  values: HarnessValuesInput;
  /** Measured parts whose values the design uses, by value key ({ volumeR: partId, … }). */
  partRefs: Record<string, number> | null;
  notes: string | null;
  ownerId: string | null;
  createdAt: number;
  updatedAt: number | null;
}

export const getHarnesses = (signal?: AbortSignal) => api.get<{ harnesses: HarnessDesign[] }>('/api/harnesses', { signal });

export const harnessesQueryOptions = () =>
  queryOptions({
    queryKey: ['harnesses', 'list'],
    queryFn: ({ signal }) => getHarnesses(signal),
  });

export const useHarnesses = () => useQuery(harnessesQueryOptions());
