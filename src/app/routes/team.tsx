import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { roleCan } from '@shared/auth/capabilities';
import { instrumentsQueryOptions } from '@/data/instruments';
import { profilesQueryOptions } from '@/data/profiles';
import { invitationsQueryOptions } from '@/features/team/api/get-invitations';
import { membersQueryOptions } from '@/features/team/api/get-members';
import { TeamScreen } from '@/features/team/components/team-screen';
import { requireCapability } from '../route-guards';

// Admins and QA leads open this screen (QA keeps the profiles and instruments); members and
// invitations are fetched for admins only, as the server refuses them to anyone else.
export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await requireCapability(queryClient, request, 'qa');
    await Promise.all([
      queryClient.ensureQueryData(profilesQueryOptions()),
      queryClient.ensureQueryData(instrumentsQueryOptions()),
      ...(roleCan(user.role, 'admin')
        ? [queryClient.ensureQueryData(membersQueryOptions()), queryClient.ensureQueryData(invitationsQueryOptions())]
        : []),
    ]);
    return null;
  };

export const Component = TeamScreen;
