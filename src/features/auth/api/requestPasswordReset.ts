import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { passwordResetRequestSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export { passwordResetRequestSchema };
export type PasswordResetRequestInput = z.input<typeof passwordResetRequestSchema>;

const acceptedSchema = z.object({ ok: z.literal(true) });

/** Always answers 202 whether or not the address has an account, so the page never says which. */
export function requestPasswordReset(input: PasswordResetRequestInput) {
  return api.post('/api/password-resets', input, { schema: acceptedSchema });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
