import { useMutation } from '@tanstack/react-query';
import type { ResetPasswordInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const requestReset = (input: { email: string }) => api.post<{ ok: true; message: string }>('/api/auth/request-reset', input);
export const resetPassword = (input: ResetPasswordInput) => api.post<{ ok: true }>('/api/auth/reset-password', input);

export const useRequestReset = () => useMutation({ mutationFn: requestReset });

/** A new password ends every session of the account, so the cached user is refreshed. */
export const useResetPassword = () => useMutation({ mutationFn: resetPassword, meta: { invalidates: [queryKeys.auth.me()] } });
