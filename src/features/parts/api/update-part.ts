import { useMutation } from '@tanstack/react-query';
import type { Part, UpdatePartInput } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const updatePart = ({ id, input }: { id: number; input: UpdatePartInput }) => api.patch<Part>(`/api/parts/${id}`, input);

/** Also used to retire a part: `{ status: 'retired', statusReason }`. */
export const useUpdatePart = () => useMutation({ mutationFn: updatePart, meta: { invalidates: [queryKeys.parts.all()] } });
