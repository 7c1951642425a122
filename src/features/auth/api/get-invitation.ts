import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type InvitationPreview = { email: string; role: Role; expiresAt: number };

export const getInvitation = (token: string, signal?: AbortSignal) =>
  api.get<InvitationPreview>(`/api/auth/invitations/${encodeURIComponent(token)}`, { signal });

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: queryKeys.auth.invitation(token),
    queryFn: ({ signal }) => getInvitation(token, signal),
    staleTime: Infinity,
  });

export const useInvitation = (token: string) => useQuery({ ...invitationQueryOptions(token), enabled: token.length >= 20 });
