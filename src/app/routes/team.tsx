import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { invitationsQueryOptions } from '@/features/team/api/get-invitations';
import { membersQueryOptions } from '@/features/team/api/get-members';
import { TeamScreen } from '@/features/team/components/team-screen';
import { requireCapability } from '../route-guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireCapability(queryClient, request, 'admin');
    await Promise.all([queryClient.ensureQueryData(membersQueryOptions()), queryClient.ensureQueryData(invitationsQueryOptions())]);
    return null;
  };

export const Component = TeamScreen;
