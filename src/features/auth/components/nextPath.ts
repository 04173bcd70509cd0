/**
 * Where to go after signing in. Only same-site paths are accepted: a `next` of "//evil.test" or
 * "https://…" would otherwise turn the sign-in page into an open redirect.
 */
export function safeNextPath(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return '/';
  if (raw.startsWith('/sign-in') || raw.startsWith('/setup')) return '/';
  return raw;
}
