import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError, isApiError } from '@/lib/api';
import { meQueryKey } from '@/lib/me';

/**
 * TanStack Query defaults for Wirewalk:
 * - no retry on a 4xx answer (it will not change by asking again); two retries on network or 5xx;
 * - data fresh for 30 s, no refetch merely because the window got focus (techs switch apps a lot);
 * - any 401 from a query or mutation re-asks /api/auth/me, so an expired session lands on sign-in.
 */
export function createQueryClient(): QueryClient {
  const recheckSession = (error: unknown, key?: readonly unknown[]) => {
    if (isApiError(error, 401) && !(key && key[0] === meQueryKey[0])) {
      void client.invalidateQueries({ queryKey: meQueryKey });
    }
  };
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: (error, query) => recheckSession(error, query.queryKey) }),
    mutationCache: new MutationCache({ onError: (error) => recheckSession(error) }),
    defaultOptions: {
      queries: {
        retry: (failureCount, error) => {
          if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
        staleTime: 30_000,
        refetchOnWindowFocus: false,
      },
      mutations: { retry: false },
    },
  });
  return client;
}
