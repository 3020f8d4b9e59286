import { HttpError } from './errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The app's own origin (scheme, host, port) from configuration, never from the request: a
 * client can write any Host or X-Forwarded-Host it likes.
 */
export function configuredOrigin(baseUrl: string): string {
  try {
    return new URL(baseUrl).origin;
  } catch {
    throw new RangeError(`NEXTAUTH_URL: "${baseUrl}" is not an absolute URL (same-origin check)`);
  }
}

/** True when the request authenticates with a cookie rather than an `Authorization: Bearer` token. */
export function usesCookieAuth(headers: Headers): boolean {
  const auth = headers.get('authorization');
  if (auth?.trim().toLowerCase().startsWith('bearer ')) return false;
  return (headers.get('cookie') ?? '').trim() !== '';
}

/**
 * Refuses a state-changing request that rides on the session cookie unless the browser says it
 * comes from our own pages: `Sec-Fetch-Site: same-origin` (set by the browser, not by page
 * scripts) or, from browsers that do not send it, an Origin equal to the configured origin.
 * Neither header, `Origin: null` (sandboxed frames, some redirects) or a foreign origin is a
 * 403. Requests with a Bearer token or no cookie carry no ambient credentials and pass.
 */
export function assertSameOriginWrite(method: string, headers: Headers, appOrigin: string): void {
  if (SAFE_METHODS.has(method.toUpperCase()) || !usesCookieAuth(headers)) return;
  const site = headers.get('sec-fetch-site');
  const origin = headers.get('origin');
  if (site !== null) {
    if (site === 'same-origin' && origin !== 'null') return;
    throw crossSite(`Sec-Fetch-Site is "${site}"${origin === 'null' ? ' and Origin is null' : ''}`);
  }
  if (origin === null) {
    throw crossSite('the request has neither an Origin nor a Sec-Fetch-Site header');
  }
  if (origin !== appOrigin) throw crossSite(`Origin "${origin.slice(0, 200)}" is not ${appOrigin}`);
}

const crossSite = (why: string) =>
  new HttpError(
    403,
    'cross_site',
    `Changes signed in with the session cookie must come from Lanewise's own pages; ${why}. Scripts should send a personal API token as Authorization: Bearer.`,
  );
