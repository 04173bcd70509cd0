import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export const userKeys = {
  all: ['users'] as const,
  list: () => ['users', 'list'] as const,
};

export function fetchUsers(signal?: AbortSignal) {
  return api.get('/api/users', { schema: z.array(userSchema), signal });
}

export function usersQueryOptions() {
  return queryOptions({ queryKey: userKeys.list(), queryFn: ({ signal }) => fetchUsers(signal) });
}

export function useUsers() {
  return useQuery(usersQueryOptions());
}
