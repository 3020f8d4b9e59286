import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatDecimals } from '@/lib/export/decimals';

/**
 * A second implementation of the rule in integer arithmetic: the shortest decimal of `x` as
 * M·10^E (BigInt M), scaled to `d` places and rounded half away from zero by division.
 */
function oracle(x: number, d: number): string {
  const m = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(String(x))!;
  const negative = m[1] === '-';
  const frac = m[3] ?? '';
  const M = BigInt(m[2] + frac);
  const E = Number(m[4] ?? 0) - frac.length;
  let q: bigint;
  if (E + d >= 0) q = M * 10n ** BigInt(E + d);
  else {
    const div = 10n ** BigInt(-(E + d));
    q = (2n * M + div) / (2n * div);
  }
  if (q === 0n) return '0';
  const digits = q.toString().padStart(d + 1, '0');
  const int = digits.slice(0, digits.length - d);
  const fr = digits.slice(digits.length - d).replace(/0+$/, '');
  return `${negative ? '-' : ''}${int}${fr ? `.${fr}` : ''}`;
}

describe('numbers written to stated decimals', () => {
  it('removes floating-point noise seen in exports', () => {
    expect(formatDecimals(41.204450000115116, 8)).toBe('41.20445'); // issue #18, l in degrees
    expect(formatDecimals(1.2699999999999996, 3)).toBe('1.27'); // issue #18
    expect(formatDecimals(0.1 + 0.2, 4)).toBe('0.3'); // exact arithmetic
  });

  it('rounds the shortest decimal half away from zero, as MariaDB casts to DECIMAL', () => {
    // 1.005 is stored as 1.00499999999999989…; its shortest decimal is 1.005 (exact arithmetic)
    expect(formatDecimals(1.005, 2)).toBe('1.01');
    expect(formatDecimals(-1.005, 2)).toBe('-1.01');
    expect(formatDecimals(0.125, 2)).toBe('0.13');
    expect(formatDecimals(9.9995, 3)).toBe('10'); // carry through every digit
    expect(formatDecimals(-0.004, 2)).toBe('0'); // never -0
    expect(formatDecimals(-0, 3)).toBe('0');
    expect(formatDecimals(359.999999996, 8)).toBe('360');
  });

  it('writes plain decimals, never exponents, for tiny and huge values', () => {
    expect(formatDecimals(1.5e-8, 8)).toBe('0.00000002'); // half away from zero
    expect(formatDecimals(1e-7, 8)).toBe('0.0000001');
    expect(formatDecimals(4e-9, 8)).toBe('0');
    expect(formatDecimals(6.02e23, 3)).toBe('602000000000000000000000');
    expect(formatDecimals(-12, 4)).toBe('-12');
  });

  it('keeps every digit of a value already within its decimals', () => {
    fc.assert(
      fc.property(fc.integer({ min: -36_000_000_000, max: 36_000_000_000 }), (n) => {
        const x = n / 1e8; // up to 8 decimals, as l in degrees
        expect(formatDecimals(x, 8)).toBe(String(x).includes('e') ? oracle(x, 8) : String(x));
        expect(Number(formatDecimals(x, 8))).toBe(x);
      }),
    );
  });

  it('agrees with integer arithmetic and stays within half a unit of the last place', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.integer({ min: 1, max: 12 }),
        (x, d) => {
          const out = formatDecimals(x, d);
          expect(out).toBe(oracle(x, d));
          expect(out).toMatch(new RegExp(`^-?\\d+(\\.\\d{1,${d}})?$`));
          expect(Math.abs(Number(out) - x)).toBeLessThanOrEqual(
            0.5 * 10 ** -d + 1e-9 * Math.abs(x),
          );
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('names the bad argument', () => {
    expect(() => formatDecimals(1, 0)).toThrow(RangeError);
    expect(() => formatDecimals(1, 31)).toThrow(/decimals must be an integer from 1 to 30, got 31/);
    expect(formatDecimals(NaN, 3)).toBe('');
  });
});
