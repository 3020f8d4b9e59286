import { NextResponse, type NextRequest } from 'next/server';
import { newNonce, pageCsp } from '@/lib/http/security-headers';

/**
 * Gives each page request a fresh nonce and its Content-Security-Policy. Next.js takes the nonce
 * from the request's CSP header and puts it on the framework's scripts; the browser gets the
 * same policy on the response. The other security headers come from next.config.ts.
 */
export function proxy(request: NextRequest) {
  const csp = pageCsp(newNonce(), {
    dev: process.env.NODE_ENV === 'development',
    https: (process.env.NEXTAUTH_URL ?? '').startsWith('https://'),
  });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set('content-security-policy', csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set('content-security-policy', csp);
  return response;
}

export const config = {
  // Pages only: API routes and built files get the fixed policy of next.config.ts.
  matcher: ['/((?!api/|_next/static/|_next/image|favicon.ico|icon.svg).*)'],
};
