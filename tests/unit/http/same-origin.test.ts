import { describe, expect, it } from 'vitest';
import { assertSameOriginWrite, configuredOrigin, usesCookieAuth } from '@/lib/http/same-origin';
import { HttpError } from '@/lib/http/errors';

const APP = 'http://127.0.0.1:3000';
const cookie = { cookie: 'lanewise.session=abc' };
const status = (method: string, h: Record<string, string>) => {
  try {
    assertSameOriginWrite(method, new Headers(h), APP);
    return 'pass';
  } catch (e) {
    return e instanceof HttpError ? e.status : 'other';
  }
};

describe('same-origin check of cookie-authenticated writes', () => {
  it('takes the origin from the configured URL, not from the request', () => {
    expect(configuredOrigin('https://lanewise.example.org/base/')).toBe(
      'https://lanewise.example.org',
    ); // WHATWG URL origin: scheme and host, no path
    expect(() => configuredOrigin('not a url')).toThrow(RangeError);
  });

  it('lets reads, Bearer requests and cookie-less requests through', () => {
    expect(status('GET', { ...cookie })).toBe('pass');
    expect(status('POST', { ...cookie, authorization: 'Bearer lw_x' })).toBe('pass');
    expect(status('POST', {})).toBe('pass');
    expect(usesCookieAuth(new Headers({ authorization: 'bearer lw_x', ...cookie }))).toBe(false);
  });

  it('accepts our origin or the browser saying same-origin', () => {
    expect(status('POST', { ...cookie, origin: APP })).toBe('pass');
    expect(status('DELETE', { ...cookie, 'sec-fetch-site': 'same-origin' })).toBe('pass');
    expect(status('PATCH', { ...cookie, 'sec-fetch-site': 'same-origin', origin: APP })).toBe(
      'pass',
    );
  });

  it('refuses a write with neither header, Origin null, a foreign origin or a cross-site fetch', () => {
    for (const m of ['POST', 'PUT', 'PATCH', 'DELETE']) expect(status(m, { ...cookie })).toBe(403);
    expect(status('POST', { ...cookie, origin: 'null' })).toBe(403);
    expect(status('POST', { ...cookie, origin: 'null', 'sec-fetch-site': 'same-origin' })).toBe(
      403,
    );
    expect(status('POST', { ...cookie, origin: 'http://127.0.0.1:9999' })).toBe(403);
    // A forwarded host naming the attacker's origin must not make it ours.
    expect(
      status('POST', {
        ...cookie,
        origin: 'http://evil.example',
        'x-forwarded-host': 'evil.example',
        host: 'evil.example',
      }),
    ).toBe(403);
    expect(status('POST', { ...cookie, 'sec-fetch-site': 'cross-site', origin: APP })).toBe(403);
    expect(status('POST', { ...cookie, 'sec-fetch-site': 'same-site' })).toBe(403);
    expect(status('POST', { ...cookie, 'sec-fetch-site': 'none' })).toBe(403);
  });
});
