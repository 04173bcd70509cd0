import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export const invitationKeys = {
  all: ['invitations'] as const,
  list: () => ['invitations', 'list'] as const,
};

export function fetchInvitations(signal?: AbortSignal) {
  return api.get('/api/invitations', { schema: z.array(invitationSchema), signal });
}

export function invitationsQueryOptions() {
  return queryOptions({ queryKey: invitationKeys.list(), queryFn: ({ signal }) => fetchInvitations(signal) });
}

export function useInvitations() {
  return useQuery(invitationsQueryOptions());
}
