import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invitationSchema, inviteInputSchema, type InviteInput } from '../../../contract/people';
import { api } from '../../../lib/api';
import { invitationKeys } from './listInvitations';

export { inviteInputSchema, type InviteInput };

export function createInvitation(input: InviteInput) {
  return api.post('/api/invitations', input, { schema: invitationSchema });
}

export function useCreateInvitation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: invitationKeys.all });
      // The invitation mail lands in the outbox; keys are shared strings, not an import of the mail feature.
      void client.invalidateQueries({ queryKey: ['mail'] });
    },
  });
}
