import { useMutation } from '@tanstack/react-query';
import type { ComparisonInput, ComparisonUpdate } from '@shared/schemas/compare';
import { api } from '@/lib/api-client';
import type { SavedComparison } from './types';
import { queryKeys } from '@/data/query-keys';

export const createComparison = (input: ComparisonInput) => api.post<SavedComparison>('/api/comparisons', input);
export const updateComparison = ({ id, ...input }: ComparisonUpdate & { id: number }) =>
  api.patch<SavedComparison>(`/api/comparisons/${id}`, input);
export const deleteComparison = (id: number) => api.delete<{ ok: true }>(`/api/comparisons/${id}`);

export const useCreateComparison = () =>
  useMutation({ mutationFn: createComparison, meta: { invalidates: [queryKeys.comparisons.all()] } });
export const useUpdateComparison = () =>
  useMutation({ mutationFn: updateComparison, meta: { invalidates: [queryKeys.comparisons.all()] } });
export const useDeleteComparison = () =>
  useMutation({ mutationFn: deleteComparison, meta: { invalidates: [queryKeys.comparisons.all()] } });
