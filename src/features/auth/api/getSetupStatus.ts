import { queryOptions, useQuery } from '@tanstack/react-query';
import { setupStatusSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export const setupKeys = {
  all: ['setup'] as const,
  status: () => ['setup', 'status'] as const,
};

export function fetchSetupStatus(signal?: AbortSignal) {
  return api.get('/api/setup', { schema: setupStatusSchema, signal });
}

export function setupStatusQueryOptions() {
  return queryOptions({
    queryKey: setupKeys.status(),
    queryFn: ({ signal }) => fetchSetupStatus(signal),
    staleTime: 5 * 60_000,
  });
}

/** Whether the install still needs its first admin, and the team's name for the header. */
export function useSetupStatus() {
  return useQuery(setupStatusQueryOptions());
}
