import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { queryClient as appQueryClient } from '@/lib/react-query';

/** App-wide providers; tests pass their own QueryClient (retry off). */
export function AppProvider({ children, queryClient = appQueryClient }: { children: ReactNode; queryClient?: QueryClient }) {
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
