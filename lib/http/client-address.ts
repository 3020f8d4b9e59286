import { BlockList, isIP } from 'node:net';

/**
 * The address of the client that sent a request, for rate limits.
 *
 * Next.js 16 gives a route handler (and next-auth's authorize()) no socket address. `next start`
 * writes the peer's address into X-Forwarded-For only when the request carries no such header
 * (`req.headers['x-forwarded-for'] ??= socket.remoteAddress` in next/dist/server/base-server.js),
 * so the last entry of that header is the socket address, or what the nearest proxy appended, or
 * — when the app is reachable without a proxy — whatever the client wrote. Behind a proxy that
 * appends the peer it saw, list the proxy in LANEWISE_TRUSTED_PROXIES: entries are then read
 * from the right and the first one that is not a trusted proxy is the client.
 */
export function clientAddress(
  xForwardedFor: string | null | undefined,
  trusted: BlockList = trustedProxies(),
): string {
  const hops = (xForwardedFor ?? '')
    .split(',')
    .map((h) => normaliseAddress(h.trim()))
    .filter((h) => h !== '');
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = hops[i];
    const family = isIP(hop);
    // An entry that is not an address cannot be a trusted proxy: it is the client's claim.
    if (family === 0 || !trusted.check(hop, family === 6 ? 'ipv6' : 'ipv4') || i === 0) return hop;
  }
  return 'unknown';
}

/** The client address of a request's headers (a `Headers` or next-auth's plain object). */
export function clientAddressOf(headers: Headers | Record<string, unknown> | undefined): string {
  const raw =
    headers instanceof Headers ? headers.get('x-forwarded-for') : headers?.['x-forwarded-for'];
  return clientAddress(typeof raw === 'string' ? raw : null);
}

/** `::ffff:127.0.0.1` (IPv4 on a dual-stack socket) is the IPv4 address; other text is kept. */
function normaliseAddress(s: string): string {
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(s);
  return (mapped ? mapped[1] : s).toLowerCase().slice(0, 64);
}

/** Parses LANEWISE_TRUSTED_PROXIES: comma-separated addresses or CIDR ranges; empty trusts none. */
export function parseTrustedProxies(setting: string): BlockList {
  const list = new BlockList();
  for (const entry of setting
    .split(',')
    .map((e) => e.trim())
    .filter(Boolean)) {
    const [address, bits] = entry.split('/');
    const family = isIP(address);
    if (family === 0) {
      throw new RangeError(`LANEWISE_TRUSTED_PROXIES: "${entry}" is not an IP address or range`);
    }
    const type = family === 6 ? 'ipv6' : 'ipv4';
    if (bits === undefined) list.addAddress(address, type);
    else {
      const prefix = Number(bits);
      if (!Number.isInteger(prefix) || prefix < 0 || prefix > (family === 6 ? 128 : 32)) {
        throw new RangeError(`LANEWISE_TRUSTED_PROXIES: "${entry}" has an invalid prefix length`);
      }
      list.addSubnet(address, prefix, type);
    }
  }
  return list;
}

let cached: BlockList | null = null;
const trustedProxies = () =>
  (cached ??= parseTrustedProxies(process.env.LANEWISE_TRUSTED_PROXIES ?? ''));
