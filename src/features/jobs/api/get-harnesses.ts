// The harness designs a job can point to (the harness screen owns them; this is only the list).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { HarnessDesign } from '@shared/schemas/harness';

export const getHarnesses = (signal?: AbortSignal) => api.get<{ harnesses: HarnessDesign[] }>('/api/harnesses', { signal });

export const harnessesQueryOptions = () => queryOptions({ queryKey: ['harnesses', 'list'], queryFn: ({ signal }) => getHarnesses(signal) });

export const useHarnesses = () => useQuery(harnessesQueryOptions());
