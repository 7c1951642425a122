import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AcceptInviteInput, User } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const acceptInvite = (input: AcceptInviteInput) => api.post<{ user: User }>('/api/auth/accept-invite', input);

/** Accepting an invitation signs the new member in. */
export function useAcceptInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvite,
    onSuccess: ({ user }) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== queryKeys.auth.me()[0] });
      queryClient.setQueryData(queryKeys.auth.me(), { user });
    },
  });
}
