// One QueryClient with the project's defaults. Mutations name the query-key prefixes they make
// stale in `meta.invalidates`; the mutation cache invalidates them after every success, so no
// screen has to remember which lists to refresh.
import { MutationCache, QueryCache, QueryClient, type QueryKey } from '@tanstack/react-query';
import { isApiError } from './api-client';

declare module '@tanstack/react-query' {
  interface Register {
    mutationMeta: { invalidates?: readonly QueryKey[] };
  }
}

export const ME_QUERY_KEY = ['auth', 'me'] as const;

export function createQueryClient(overrides?: { retry?: false }): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      // A 401 on any screen means the session ended (expired, or the account was changed):
      // refresh who we are, and the layout sends the user to sign in.
      onError: (err, query) => {
        if (isApiError(err) && err.status === 401 && query.queryKey[0] !== ME_QUERY_KEY[0]) {
          void queryClient.invalidateQueries({ queryKey: ME_QUERY_KEY });
        }
      },
    }),
    mutationCache: new MutationCache({
      onSuccess: async (_data, _variables, _context, mutation) => {
        const prefixes = mutation.meta?.invalidates ?? [];
        await Promise.all(prefixes.map((queryKey) => queryClient.invalidateQueries({ queryKey })));
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Client errors (4xx) will not heal by asking again; network and server errors might.
        retry:
          overrides?.retry ??
          ((failureCount, err) => {
            if (isApiError(err) && err.status >= 400 && err.status < 500) return false;
            return failureCount < 2;
          }),
      },
      mutations: { retry: false },
    },
  });
  return queryClient;
}

/** The application's client (tests make their own with createQueryClient({ retry: false })). */
export const queryClient = createQueryClient();
