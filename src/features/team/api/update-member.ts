import { useMutation } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type MemberChange = { role?: Role; disabled?: boolean };

export const updateMember = ({ id, change }: { id: string; change: MemberChange }) =>
  api.patch<{ ok: true }>(`/api/team/members/${encodeURIComponent(id)}`, change);

export const useUpdateMember = () => useMutation({ mutationFn: updateMember, meta: { invalidates: [queryKeys.team.members()] } });
