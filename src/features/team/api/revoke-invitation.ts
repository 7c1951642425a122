import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const revokeInvitation = (id: string) => api.delete<{ ok: true }>(`/api/team/invitations/${encodeURIComponent(id)}`);

export const useRevokeInvitation = () => useMutation({ mutationFn: revokeInvitation, meta: { invalidates: [['team', 'invitations']] } });
