import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { updateUserInputSchema, userSchema } from '../../../contract/people';
import { api } from '../../../lib/api';
import { sessionKeys } from '../../../lib/session';
import { userKeys } from './listUsers';

export { updateUserInputSchema };
export type UpdateUserInput = z.input<typeof updateUserInputSchema>;

export function updateUser({ id, ...input }: UpdateUserInput & { id: number }) {
  return api.patch(`/api/users/${id}`, input, { schema: userSchema });
}

export function useUpdateUser() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: userKeys.all });
      // An admin may have changed their own roles; the shell's navigation follows them.
      void client.invalidateQueries({ queryKey: sessionKeys.me() });
    },
  });
}
