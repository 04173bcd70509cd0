import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { firstAdminInputSchema, meSchema } from '../../../contract/people';
import { api } from '../../../lib/api';
import { startSession } from '../../../lib/session';
import { setupKeys } from './getSetupStatus';

export { firstAdminInputSchema };
export type FirstAdminInput = z.input<typeof firstAdminInputSchema>;

export function createFirstAdmin(input: FirstAdminInput) {
  return api.post('/api/setup', input, { schema: meSchema, rotatesSession: true });
}

export function useCreateFirstAdmin() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createFirstAdmin,
    onSuccess: (me) => {
      startSession(client, me);
      void client.invalidateQueries({ queryKey: setupKeys.all });
    },
  });
}
