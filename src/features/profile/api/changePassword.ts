import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { passwordChangeSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export { passwordChangeSchema };
export type PasswordChangeInput = z.input<typeof passwordChangeSchema>;

/** 400 bad_password when the current password is wrong. */
export function changePassword(input: PasswordChangeInput) {
  // Dropping the CSRF token is harmless if the server keeps the session, and right if it regenerates it.
  return api.post('/api/profile/password', input, { rotatesSession: true });
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
