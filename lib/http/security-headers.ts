/**
 * The security headers of every response. Pages get a Content-Security-Policy with a fresh
 * nonce per request (proxy.ts), which Next.js reads from the request's CSP header and puts on
 * its own scripts; API responses and files get a policy that allows nothing to run or frame.
 */

/** Headers that do not depend on the request (next.config.ts sends them on every path). */
export const STATIC_SECURITY_HEADERS: ReadonlyArray<{ key: string; value: string }> = [
  // Older browsers that ignore `frame-ancestors` still refuse to frame us.
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  // Links out carry our origin at most, never a project's path.
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  {
    key: 'Permissions-Policy',
    value:
      'camera=(), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), ' +
      'midi=(), magnetometer=(), gyroscope=(), accelerometer=(), display-capture=(), ' +
      'browsing-topics=(), interest-cohort=()',
  },
];

/** For JSON, CSV and other non-page responses: nothing in them may run, load or be framed. */
export const API_CSP = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'";

/** A nonce: 128 random bits, base64 (as CSP's nonce-source wants). */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

/**
 * The policy of an HTML page. Scripts run only with the nonce ('strict-dynamic' lets the
 * framework's nonced loader add its chunks); no 'unsafe-inline' for scripts. Style elements need
 * the nonce too, but style attributes are allowed: the server-rendered HTML of the plots, the
 * progress bar and the tracer badges sets sizes and colours in `style` attributes, which a
 * nonce cannot cover, and an attribute cannot run script. Downloads and figure previews are
 * `blob:` URLs, drawn into images and canvases, hence `blob:`/`data:` images.
 */
export function pageCsp(nonce: string, { dev = false, https = false } = {}): string {
  if (!/^[A-Za-z0-9+/]+=*$/.test(nonce)) {
    throw new RangeError(`pageCsp: nonce "${nonce}" is not base64`);
  }
  return [
    "default-src 'self'",
    // React's development build evaluates code for its error overlay; production does not.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ''}`,
    `style-src 'self' 'nonce-${nonce}'`,
    `style-src-elem 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(https ? ['upgrade-insecure-requests'] : []),
  ].join('; ');
}
