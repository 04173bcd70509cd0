import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationPreviewSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export const invitationPreviewKeys = {
  all: ['invitations', 'by-token'] as const,
  one: (token: string) => ['invitations', 'by-token', token] as const,
};

export function fetchInvitationPreview(token: string, signal?: AbortSignal) {
  return api.get(`/api/invitations/by-token/${encodeURIComponent(token)}`, { schema: invitationPreviewSchema, signal });
}

export function invitationPreviewQueryOptions(token: string) {
  return queryOptions({
    queryKey: invitationPreviewKeys.one(token),
    queryFn: ({ signal }) => fetchInvitationPreview(token, signal),
    staleTime: Infinity,
    retry: false,
  });
}

/** Who an invitation link is for: 404 not_found, 410 expired, 409 used come back as ApiError. */
export function useInvitationPreview(token: string) {
  return useQuery(invitationPreviewQueryOptions(token));
}
