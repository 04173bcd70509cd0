const HERE = 'http://holdfire.invalid';

/**
 * Where to go after signing in. Only same-site paths are accepted: a `next` of "//evil.test" or
 * "https://…" would otherwise turn the sign-in page into an open redirect. Browsers drop tabs and line breaks
 * inside a URL and read "\" as "/", so "/\t/evil.test" is "//evil.test" to them: such characters are refused,
 * and what is left must resolve to this origin.
 */
export function safeNextPath(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith('/') || raw.startsWith('//')) return '/';
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f\\]/.test(raw)) return '/';
  let url: URL;
  try {
    url = new URL(raw, HERE);
  } catch {
    return '/';
  }
  if (url.origin !== HERE) return '/';
  const path = `${url.pathname}${url.search}${url.hash}`;
  if (path.startsWith('/sign-in') || path.startsWith('/setup')) return '/';
  return path;
}
