import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { acceptInvitationInputSchema, meSchema } from '../../../contract/people';
import { api } from '../../../lib/api';
import { startSession } from '../../../lib/session';

export { acceptInvitationInputSchema };
export type AcceptInvitationInput = z.input<typeof acceptInvitationInputSchema>;

export function acceptInvitation(input: AcceptInvitationInput) {
  return api.post('/api/invitations/accept', input, { schema: meSchema, rotatesSession: true });
}

export function useAcceptInvitation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (me) => startSession(client, me),
  });
}
