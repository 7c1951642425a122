import { useMutation } from '@tanstack/react-query';
import type { PromoteInput } from '@shared/schemas/lots';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const promoteLotItems = ({ id, input }: { id: number; input: PromoteInput }) =>
  api.post<{ created: number; partIds: number[] }>(`/api/lots/${id}/promote`, input);

export const usePromoteLotItems = () => useMutation({ mutationFn: promoteLotItems, meta: { invalidates: [queryKeys.parts.all()] } });
