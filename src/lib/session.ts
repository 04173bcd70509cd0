import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import { meSchema, type Me } from '../contract/people';
import { api, isApiError } from './api';

/**
 * The signed-in person. It lives in lib rather than in a feature because the shell, the role guard and
 * every feature need it; features must not import each other.
 */

export const sessionKeys = {
  all: ['auth'] as const,
  me: () => ['auth', 'me'] as const,
};

/** null means "signed out": a normal state, not an error. */
export async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await api.get('/api/auth/me', { schema: meSchema, signal });
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: sessionKeys.me(),
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 60_000,
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}

/**
 * After sign-in, setup or accepting an invitation: the server made a new session. Drop whatever the
 * previous person (or nobody) had cached, then seed the new person so the shell renders at once.
 */
export function startSession(client: QueryClient, me: Me): void {
  client.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
  client.setQueryData(sessionKeys.me(), me);
}

/** For pages inside the signed-in shell, which only renders once the person is known. */
export function useSignedInMe(): Me {
  const { data } = useMe();
  if (!data) throw new Error('useSignedInMe() was used outside the signed-in app shell.');
  return data;
}
