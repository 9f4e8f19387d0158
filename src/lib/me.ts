/**
 * Who is signed in, and what the server offers (`/api/meta`).
 * useMe() is the one source of the current person; every 401 from any query
 * clears it (see src/app/query-client.ts), which sends the person to sign-in.
 */
import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { Me, Role } from '@shared/api/auth';
import { api, isApiError } from './api';

export type { Me, Role };

export const meQueryKey = ['auth', 'me'] as const;
export const metaQueryKey = ['meta'] as const;

export interface Meta {
  outbox: boolean;
  demo: boolean;
  version: string;
}

/** Answers the signed-in person, or null when nobody is signed in (401). */
export async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await api.get<Me>('/api/auth/me', signal);
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export function useMe() {
  const query = useQuery({ queryKey: meQueryKey, queryFn: ({ signal }) => fetchMe(signal), staleTime: 5 * 60_000 });
  return { me: query.data ?? null, isPending: query.isPending, error: query.error, refetch: query.refetch };
}

/** The signed-in person's role, or null. */
export function useRole(): Role | null {
  return useMe().me?.role ?? null;
}

export function useMeta() {
  const query = useQuery({
    queryKey: metaQueryKey,
    queryFn: ({ signal }) => api.get<Meta>('/api/meta', signal),
    staleTime: Infinity,
  });
  return { meta: query.data ?? null, isPending: query.isPending };
}

/** After sign-in or accepting an invitation: remember the person, forget anything cached for someone else. */
export function setSignedIn(queryClient: QueryClient, me: Me): void {
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'meta' });
  queryClient.setQueryData(meQueryKey, me);
}

export function setSignedOut(queryClient: QueryClient): void {
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'meta' });
  queryClient.setQueryData(meQueryKey, null);
}

/** Signs out; the guard then shows the sign-in page. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post('/api/auth/sign-out'),
    onSettled: () => setSignedOut(queryClient),
  });
}
