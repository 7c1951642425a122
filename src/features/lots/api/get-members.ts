// The members a watcher can be chosen from (GET /api/lots/watcher-candidates, qa and admin); the
// lot form and page ask for it only for those roles. Techs may only watch a lot themselves.
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { Member as TeamMember } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { LotWatcher } from './types';

/** What the watcher list needs of a member. */
export type Member = Pick<TeamMember, 'id' | 'email' | 'name' | 'role'>;

export const getMembers = (signal?: AbortSignal) => api.get<{ members: Member[] }>('/api/lots/watcher-candidates', { signal });

export const membersQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.lots.watcherCandidates(),
    queryFn: ({ signal }) => getMembers(signal),
  });

export const useMembers = (enabled: boolean) => useQuery({ ...membersQueryOptions(), enabled });

export const setWatchers = ({ id, userIds }: { id: number; userIds: string[] }) =>
  api.put<{ watchers: LotWatcher[] }>(`/api/lots/${id}/watchers`, { userIds });
export const useSetWatchers = () => useMutation({ mutationFn: setWatchers, meta: { invalidates: [queryKeys.lots.all()] } });
