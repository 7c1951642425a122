import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type Invitation = {
  id: string;
  email: string;
  role: Role;
  expiresAt: number;
  acceptedAt: number | null;
  revokedAt: number | null;
  createdAt: number;
};

export type InvitationState = 'open' | 'accepted' | 'revoked' | 'expired';

export function invitationState(inv: Invitation, now = Date.now()): InvitationState {
  if (inv.acceptedAt) return 'accepted';
  if (inv.revokedAt) return 'revoked';
  if (inv.expiresAt <= now) return 'expired';
  return 'open';
}

export const getInvitations = (signal?: AbortSignal) => api.get<{ invitations: Invitation[] }>('/api/team/invitations', { signal });

export const invitationsQueryOptions = () =>
  queryOptions({ queryKey: queryKeys.team.invitations(), queryFn: ({ signal }) => getInvitations(signal) });

export const useInvitations = () => useQuery(invitationsQueryOptions());
