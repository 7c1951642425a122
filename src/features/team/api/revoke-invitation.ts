import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const revokeInvitation = (id: string) => api.delete<{ ok: true }>(`/api/team/invitations/${encodeURIComponent(id)}`);

export const useRevokeInvitation = () =>
  useMutation({ mutationFn: revokeInvitation, meta: { invalidates: [queryKeys.team.invitations()] } });
