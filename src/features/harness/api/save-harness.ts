import { useMutation } from '@tanstack/react-query';
import type { HarnessDesign, HarnessDesignInput } from '@shared/schemas/harness';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const createHarness = (input: HarnessDesignInput) => api.post<HarnessDesign>('/api/harnesses', input);

export const updateHarness = ({ id, input }: { id: number; input: HarnessDesignInput }) =>
  api.put<HarnessDesign>(`/api/harnesses/${id}`, input);

export const deleteHarness = (id: number) => api.delete<{ ok: true }>(`/api/harnesses/${id}`);

export const useCreateHarness = () => useMutation({ mutationFn: createHarness, meta: { invalidates: [queryKeys.harnesses.all()] } });
export const useUpdateHarness = () => useMutation({ mutationFn: updateHarness, meta: { invalidates: [queryKeys.harnesses.all()] } });
export const useDeleteHarness = () => useMutation({ mutationFn: deleteHarness, meta: { invalidates: [queryKeys.harnesses.all()] } });
