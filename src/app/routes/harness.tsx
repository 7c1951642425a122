import type { QueryClient } from '@tanstack/react-query';
import { harnessesQueryOptions } from '@/data/harnesses';
import { HarnessScreen } from '@/features/harness/components/harness-screen';

// The curves are computed in the browser; only the saved designs come from the server.
export const makeLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(harnessesQueryOptions());
  return null;
};

export const Component = HarnessScreen;
