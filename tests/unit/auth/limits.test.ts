import { describe, expect, it } from 'vitest';
import { signInWaitSeconds } from '@/lib/auth/limits';

const opts = { freeFailures: 10, baseSeconds: 60, maxSeconds: 900 };

describe('signInWaitSeconds', () => {
  it('lets the free failures through without waiting', () => {
    for (let n = 0; n < 10; n++) expect(signInWaitSeconds(n, 0, opts)).toBe(0);
  });

  it('doubles the wait with each failure past the free ones, up to the cap', () => {
    // 60·2^k s capped at 900 s: worked out by hand
    const waits = [10, 11, 12, 13, 14, 20].map((n) => signInWaitSeconds(n, 0, opts));
    expect(waits).toEqual([60, 120, 240, 480, 900, 900]);
  });

  it('counts the wait from the last failure', () => {
    expect(signInWaitSeconds(10, 45, opts)).toBe(15);
    expect(signInWaitSeconds(10, 60, opts)).toBe(0);
    expect(signInWaitSeconds(11, 100.5, opts)).toBe(20); // 120 − 100.5, rounded up
  });
});
