/** Where a sign-in goes when no usable `next` was given. */
export const DEFAULT_NEXT = '/projects';

// Any origin works as the base: only whether the result stays on it matters.
const BASE = 'http://lanewise.invalid';

/**
 * The path to go to after signing in: `next` when it is a relative path on this site, after the
 * same URL parsing a browser does (backslashes count as slashes, tabs and newlines are dropped,
 * dot segments are resolved), otherwise DEFAULT_NEXT. Used by pages, forms and next-auth alike.
 */
export function safeNext(next: unknown): string {
  if (typeof next !== 'string' || !next.startsWith('/')) return DEFAULT_NEXT;
  // Backslashes and control characters have no place in our own links; browsers rewrite them.
  if (/[\\\u0000-\u001f\u007f]/.test(next)) return DEFAULT_NEXT;
  let url: URL;
  try {
    url = new URL(next, BASE);
  } catch {
    return DEFAULT_NEXT;
  }
  if (url.origin !== BASE) return DEFAULT_NEXT;
  const path = `${url.pathname}${url.search}${url.hash}`;
  // "/.//host" resolves to "//host", which would leave the site when used as a link.
  if (path.startsWith('//') || new URL(path, BASE).origin !== BASE) return DEFAULT_NEXT;
  return path;
}
