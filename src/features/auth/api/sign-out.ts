import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const signOut = () => api.post<{ ok: true }>('/api/auth/sign-out');

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== queryKeys.auth.me()[0] });
      queryClient.setQueryData(queryKeys.auth.me(), { user: null });
    },
  });
}
