// Tolerance profiles: the Bench, the part page and Team (which edits them) read the same list.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProfileRules } from '@shared/schemas/bench';
import type { PartKind } from '@shared/schemas/common';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

export type Profile = {
  id: number;
  name: string;
  kind: PartKind;
  nominalMin: number | null;
  nominalMax: number | null;
  tolerancePct: number;
  rules: ProfileRules;
  createdAt: number;
};

export const profilesQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.profiles.list(),
    queryFn: ({ signal }) => api.get<{ profiles: Profile[] }>('/api/profiles', { signal }),
    staleTime: 5 * 60_000,
  });

export const useProfiles = () => useQuery(profilesQueryOptions());
