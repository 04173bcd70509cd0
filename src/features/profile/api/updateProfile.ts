import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { meSchema, profileUpdateSchema } from '../../../contract/people';
import { api } from '../../../lib/api';
import { sessionKeys } from '../../../lib/session';

export { profileUpdateSchema };
export type ProfileUpdateInput = z.input<typeof profileUpdateSchema>;

export function updateProfile(input: ProfileUpdateInput) {
  return api.patch('/api/profile', input, { schema: meSchema });
}

export function useUpdateProfile() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: (me) => {
      client.setQueryData(sessionKeys.me(), me);
      // Lists that show names (people, later count logs) refetch by prefix.
      void client.invalidateQueries({ queryKey: ['users'] });
    },
  });
}
