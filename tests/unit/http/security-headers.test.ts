import { describe, expect, it } from 'vitest';
import { API_CSP, newNonce, pageCsp, STATIC_SECURITY_HEADERS } from '@/lib/http/security-headers';

const directives = (csp: string) =>
  new Map(
    csp.split(';').map((d) => {
      const [name, ...values] = d.trim().split(/\s+/);
      return [name, values] as const;
    }),
  );

describe('security headers', () => {
  it('a page policy runs scripts only with its nonce and cannot be framed', () => {
    const nonce = newNonce();
    const d = directives(pageCsp(nonce));
    expect(d.get('script-src')).toEqual(["'self'", `'nonce-${nonce}'`, "'strict-dynamic'"]);
    expect(pageCsp(nonce)).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(pageCsp(nonce)).not.toContain('unsafe-eval');
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
    expect(d.get('object-src')).toEqual(["'none'"]);
    expect(d.get('img-src')).toEqual(["'self'", 'blob:', 'data:']);
    expect(pageCsp(nonce, { dev: true })).toContain("'unsafe-eval'");
    expect(pageCsp(nonce, { https: true })).toContain('upgrade-insecure-requests');
    expect(() => pageCsp("x' 'unsafe-inline")).toThrow(RangeError);
  });

  it('nonces are fresh 128-bit base64 values', () => {
    const seen = new Set(Array.from({ length: 200 }, newNonce));
    expect(seen.size).toBe(200);
    for (const n of seen) expect(Buffer.from(n, 'base64')).toHaveLength(16);
  });

  it('API responses may run and frame nothing; the fixed headers are all there', () => {
    expect(directives(API_CSP).get('default-src')).toEqual(["'none'"]);
    expect(directives(API_CSP).get('frame-ancestors')).toEqual(["'none'"]);
    const h = new Map(STATIC_SECURITY_HEADERS.map((x) => [x.key, x.value]));
    expect(h.get('X-Frame-Options')).toBe('DENY');
    expect(h.get('X-Content-Type-Options')).toBe('nosniff');
    expect(h.get('Referrer-Policy')).toBe('strict-origin-when-cross-origin');
    for (const f of ['camera', 'microphone', 'geolocation'])
      expect(h.get('Permissions-Policy')).toContain(`${f}=()`);
  });
});
