import { useMutation } from '@tanstack/react-query';
import type { ProfileInput } from '@shared/schemas/bench';
import type { Profile } from '@/data/profiles';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

/** New profile (no id) or a change to one; PUT sends the whole profile. */
export const saveProfile = ({ id, input }: { id?: number; input: ProfileInput }) =>
  id ? api.put<Profile>(`/api/profiles/${id}`, input) : api.post<Profile>('/api/profiles', input);

export const useSaveProfile = () => useMutation({ mutationFn: saveProfile, meta: { invalidates: [queryKeys.profiles.all()] } });
