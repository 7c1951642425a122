import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignInInput, User } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const signIn = (input: SignInInput) => api.post<{ user: User }>('/api/auth/sign-in', input);

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: ({ user }) => {
      // Whatever another account left in the cache is not this user's to see.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== queryKeys.auth.me()[0] });
      queryClient.setQueryData(queryKeys.auth.me(), { user });
    },
  });
}
