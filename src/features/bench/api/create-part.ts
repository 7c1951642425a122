import { useMutation } from '@tanstack/react-query';
import type { CreatePartInput, Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';

export const createPart = (input: CreatePartInput) => api.post<Part>('/api/parts', input);

export const useCreatePart = () => useMutation({ mutationFn: createPart, meta: { invalidates: [['parts']] } });
