import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';
import { sessionKeys } from './session';

/** A 401 anywhere means the session ended (expired, signed out elsewhere): mark the person signed out. */
function onAnyError(client: () => QueryClient) {
  return (error: unknown) => {
    if (isApiError(error) && error.status === 401 && error.code === 'unauthenticated') {
      client().setQueryData(sessionKeys.me(), null);
    }
  };
}

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: onAnyError(() => client) }),
    mutationCache: new MutationCache({ onError: onAnyError(() => client) }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Retrying a 4xx cannot help; retrying a dropped connection on a test site often does.
        retry: (failureCount, error) => {
          if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
      },
      mutations: { retry: false },
    },
  });
  return client;
}
