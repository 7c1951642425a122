import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Member } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const getMembers = (signal?: AbortSignal) => api.get<{ members: Member[] }>('/api/team/members', { signal });

export const membersQueryOptions = () => queryOptions({ queryKey: queryKeys.team.members(), queryFn: ({ signal }) => getMembers(signal) });

export const useMembers = () => useQuery(membersQueryOptions());
