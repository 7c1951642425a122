// Who is signed in. Kept in lib/ (not in the auth feature) because every feature needs the role to
// hide what it may not do; the server decides what is allowed.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { roleCan, type Capability } from '@shared/auth/capabilities';
import type { User } from '@shared/schemas/auth';
import { api } from './api-client';
import { ME_QUERY_KEY } from './react-query';

export type MeResponse = { user: User | null };

export const getMe = (signal?: AbortSignal) => api.get<MeResponse>('/api/auth/me', { signal });

export const meQueryOptions = () =>
  queryOptions({
    queryKey: ME_QUERY_KEY,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQueryOptions());

/** The signed-in user, or null (screens under the app layout always have one). */
export const useUser = (): User | null => useMe().data?.user ?? null;

/** Whether the signed-in user's role has a capability (for hiding controls only). */
export const useCan = (capability: Capability): boolean => roleCan(useUser()?.role, capability);
