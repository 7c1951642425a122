import { useMutation } from '@tanstack/react-query';
import type { InviteInput } from '@shared/schemas/auth';
import type { Role } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const createInvitation = (input: InviteInput) =>
  api.post<{ id: string; email: string; role: Role; expiresAt: number }>('/api/team/invitations', input);

// The invitation e-mail lands in the outbox too.
export const useCreateInvitation = () =>
  useMutation({ mutationFn: createInvitation, meta: { invalidates: [queryKeys.team.invitations(), queryKeys.outbox.all()] } });
