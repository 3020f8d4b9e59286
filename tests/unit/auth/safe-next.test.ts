import { describe, expect, it } from 'vitest';
import { DEFAULT_NEXT, safeNext } from '@/lib/auth/safe-next';

// Where a browser would go: the WHATWG URL parser resolving the link on our own origin.
const APP = 'http://app.example:3000';
const landsOn = (link: string) => new URL(link, APP).origin;

describe('safeNext', () => {
  // Hostile values of `next` as a page receives them (query decoding already done). Each one is
  // accepted by the old rule "starts with / and not with //" or is an absolute URL.
  const hostile: [string, unknown][] = [
    ['backslash, decoded from /%5C', '/\\127.0.0.1:9999/x'],
    ['tab, decoded from /%09', '/\t/127.0.0.1:9999/x'],
    ['newline', '/\n/evil.example/x'],
    ['carriage return', '/\r/evil.example'],
    ['double backslash', '/\\\\evil.example'],
    ['slash then backslash', '/\\/evil.example'],
    ['dot segment to //', '/.//evil.example/x'],
    ['dot-dot segment to //', '/x/..//evil.example'],
    ['protocol-relative', '//evil.example/x'],
    ['absolute URL', 'https://evil.example/x'],
    ['javascript URL', 'javascript:alert(1)'],
    ['leading space', ' /projects'],
    ['NUL byte', '/\u0000/evil.example'],
    ['not a string', ['/projects']],
    ['missing', undefined],
  ];
  it.each(hostile)('refuses %s', (_, input) => {
    expect(safeNext(input)).toBe(DEFAULT_NEXT);
  });

  it('never yields a link that leaves the site, for every hostile input', () => {
    for (const [, input] of hostile) expect(landsOn(safeNext(input))).toBe(APP);
  });

  // The old rule, kept here only to show these inputs did get through it.
  const oldRule = (n: string) => n.startsWith('/') && !n.startsWith('//');
  it('the browser really would leave the site for the relative ones the old rule let through', () => {
    const leaking = hostile
      .map(([, input]) => input)
      .filter((n): n is string => typeof n === 'string' && oldRule(n) && landsOn(n) !== APP);
    // backslash, tab, newline, CR, double backslash, slash-backslash: WHATWG URL parsing
    expect(leaking.length).toBe(6);
  });

  it('dot segments would leave the site once their resolved path is used as a link', () => {
    // The resolved path itself begins with "//": WHATWG URL parsing
    for (const n of ['/.//evil.example/x', '/x/..//evil.example']) {
      const resolved = new URL(n, APP).pathname;
      expect(landsOn(resolved)).toBe('http://evil.example');
    }
  });

  const kept: [string, string][] = [
    ['/projects', '/projects'],
    ['/projects/p1/runs?tab=links#top', '/projects/p1/runs?tab=links#top'],
    ['/invite/abc_DEF-123', '/invite/abc_DEF-123'],
    ['/a/../b', '/b'], // dot segments resolved, as the browser would
    ['/%5C127.0.0.1', '/%5C127.0.0.1'], // still encoded: an ordinary path segment
  ];
  it.each(kept)('keeps the same-site path %s', (input, out) => {
    expect(safeNext(input)).toBe(out);
    expect(landsOn(out)).toBe(APP);
  });
});
