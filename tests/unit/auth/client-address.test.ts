import { describe, expect, it } from 'vitest';
import { clientAddress, clientAddressOf, parseTrustedProxies } from '@/lib/http/client-address';

const none = parseTrustedProxies('');
const proxies = parseTrustedProxies('10.0.0.0/8, 192.0.2.1, 2001:db8::/32');

describe('clientAddress', () => {
  it('without trusted proxies takes the last hop (the socket address next start writes)', () => {
    expect(clientAddress('127.0.0.5', none)).toBe('127.0.0.5');
    expect(clientAddress('203.0.113.9, 127.0.0.5', none)).toBe('127.0.0.5');
  });

  it('reads IPv4 on a dual-stack socket as IPv4', () => {
    expect(clientAddress('::ffff:127.0.0.1', none)).toBe('127.0.0.1');
  });

  it('skips trusted proxies from the right and ignores what the client wrote before them', () => {
    expect(clientAddress('198.51.100.7, 10.1.2.3', proxies)).toBe('198.51.100.7');
    expect(clientAddress('6.6.6.6, 198.51.100.7, 192.0.2.1, 10.0.0.9', proxies)).toBe(
      '198.51.100.7',
    );
    expect(clientAddress('2001:db9::1, 2001:db8::5', proxies)).toBe('2001:db9::1');
  });

  it('a hop that is not an address is the client, never a proxy', () => {
    expect(clientAddress('198.51.100.7, garbage, 10.0.0.9', proxies)).toBe('garbage');
  });

  it('all hops trusted: the leftmost is the best there is; no header: unknown', () => {
    expect(clientAddress('10.0.0.1, 10.0.0.2', proxies)).toBe('10.0.0.1');
    expect(clientAddress(null, proxies)).toBe('unknown');
    expect(clientAddress(' , ', none)).toBe('unknown');
  });

  it('reads Headers and next-auth plain header objects alike', () => {
    expect(clientAddressOf(new Headers({ 'x-forwarded-for': '127.0.0.9' }))).toBe('127.0.0.9');
    expect(clientAddressOf({ 'x-forwarded-for': '127.0.0.9' })).toBe('127.0.0.9');
    expect(clientAddressOf(undefined)).toBe('unknown');
  });

  it('rejects a setting that is not an address or range, naming it', () => {
    expect(() => parseTrustedProxies('10.0.0.1, proxy.lan')).toThrow(RangeError);
    expect(() => parseTrustedProxies('10.0.0.0/33')).toThrow(/10\.0\.0\.0\/33/);
  });
});
