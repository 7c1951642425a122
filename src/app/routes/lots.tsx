import type { QueryClient } from '@tanstack/react-query';
import { lotsQueryOptions } from '@/features/lots/api/get-lots';
import { LotsScreen } from '@/features/lots/components/lots-screen';

export const makeLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(lotsQueryOptions());
  return null;
};

export const Component = LotsScreen;
