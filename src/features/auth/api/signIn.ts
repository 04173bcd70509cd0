import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { loginInputSchema, meSchema } from '../../../contract/people';
import { api } from '../../../lib/api';
import { startSession } from '../../../lib/session';

export { loginInputSchema };
export type SignInInput = z.input<typeof loginInputSchema>;

export function signIn(input: SignInInput) {
  return api.post('/api/auth/login', input, { schema: meSchema, rotatesSession: true });
}

export function useSignIn() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => startSession(client, me),
  });
}
