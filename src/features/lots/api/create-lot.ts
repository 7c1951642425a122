import { useMutation } from '@tanstack/react-query';
import type { CreateLotInput } from '@shared/schemas/lots';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { Lot } from './types';

export const createLot = (input: CreateLotInput) => api.post<Lot>('/api/lots', input);

export const useCreateLot = () => useMutation({ mutationFn: createLot, meta: { invalidates: [queryKeys.lots.all()] } });
