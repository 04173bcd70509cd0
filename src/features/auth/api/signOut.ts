import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export function signOut() {
  return api.post('/api/auth/logout', undefined, { rotatesSession: true });
}

/**
 * Signing out ends with a full page load of /sign-in rather than a client-side route change: a phone
 * on the test site is often shared, and a reload guarantees nothing of the previous person's data stays
 * in memory (query cache, CSRF token, form state).
 */
export function useSignOut(leave: () => void = () => window.location.assign('/sign-in')) {
  return useMutation({
    mutationFn: signOut,
    onSuccess: leave,
  });
}
