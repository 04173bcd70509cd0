import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { passwordResetCompleteSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export { passwordResetCompleteSchema };
export type PasswordResetCompleteInput = z.input<typeof passwordResetCompleteSchema>;

export function completePasswordReset(input: PasswordResetCompleteInput) {
  return api.post('/api/password-resets/complete', input);
}

export function useCompletePasswordReset() {
  return useMutation({ mutationFn: completePasswordReset });
}
