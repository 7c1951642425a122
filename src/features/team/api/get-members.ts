import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/common';
import { api } from '@/lib/api-client';

export type Member = { id: string; email: string; name: string; role: Role; disabledAt: number | null; createdAt: number };

export const getMembers = (signal?: AbortSignal) => api.get<{ members: Member[] }>('/api/team/members', { signal });

export const membersQueryOptions = () => queryOptions({ queryKey: ['team', 'members'], queryFn: ({ signal }) => getMembers(signal) });

export const useMembers = () => useQuery(membersQueryOptions());
