import { describe, expect, it } from 'vitest';
import { permutationTest, signFlipTest } from '@/lib/stats/permutation';
import { makeRng } from '@/lib/stats/rng';
import { ksTwoSample } from '@/lib/stats/ks';

function normals(seed: number, n: number, shift = 0): Float64Array {
  const rng = makeRng(seed);
  return Float64Array.from({ length: n }, () => shift + rng.normal());
}

/** Exact p-value by enumerating every split of the pooled sample (brute-force oracle). */
function exactPermutationP(a: number[], b: number[]): number {
  const pooled = [...a, ...b];
  const n = pooled.length;
  const na = a.length;
  const total = pooled.reduce((s, x) => s + x, 0);
  const observed =
    a.reduce((s, x) => s + x, 0) / na - (total - a.reduce((s, x) => s + x, 0)) / (n - na);
  let count = 0;
  let all = 0;
  const rec = (start: number, left: number, sum: number) => {
    if (left === 0) {
      all++;
      const t = sum / na - (total - sum) / (n - na);
      if (t >= observed - 1e-12) count++;
      return;
    }
    for (let i = start; i <= n - left; i++) rec(i + 1, left - 1, sum + pooled[i]);
  };
  rec(0, na, 0);
  return count / all;
}

describe('permutation test', () => {
  it('agrees with the exact enumeration on a small sample', () => {
    // brute-force oracle: all C(12, 6) = 924 splits
    const a = [1.2, 2.9, 3.1, 2.2, 4.0, 3.3];
    const b = [0.8, 1.9, 2.4, 1.1, 2.0, 1.5];
    const exact = exactPermutationP(a, b);
    const mc = permutationTest(a, b, { alternative: 'greater', permutations: 40_000, seed: 3 });
    expect(Math.abs(mc.pValue - exact)).toBeLessThan(0.005);
    expect(mc.observed).toBeCloseTo(16.7 / 6 - 9.7 / 6, 12);
  });

  it('gives roughly uniform p-values under the null', () => {
    // under H0 P(p ≤ α) ≤ α with the +1 correction (Phipson & Smyth 2010); uniform-ish by KS
    const ps: number[] = [];
    for (let r = 0; r < 300; r++) {
      ps.push(
        permutationTest(normals(1000 + r, 15), normals(5000 + r, 15), {
          permutations: 199,
          seed: r,
        }).pValue,
      );
    }
    const below05 = ps.filter((p) => p <= 0.05).length / ps.length;
    expect(below05).toBeLessThan(0.1);
    expect(below05).toBeGreaterThan(0.01);
    const uniform = Array.from({ length: 300 }, (_, i) => (i + 0.5) / 300);
    expect(ksTwoSample(ps, uniform).pValue).toBeGreaterThan(0.01);
  });

  it('gives small p-values under a shift, in the right direction only', () => {
    // a one-sigma shift with n = 40 per group is detected at p ≪ 0.01 (power ≈ 1)
    const a = normals(7, 40, 1);
    const b = normals(8, 40);
    expect(
      permutationTest(a, b, { alternative: 'greater', permutations: 2000, seed: 1 }).pValue,
    ).toBeLessThan(0.01);
    expect(
      permutationTest(a, b, { alternative: 'two-sided', permutations: 2000, seed: 1 }).pValue,
    ).toBeLessThan(0.01);
    expect(
      permutationTest(a, b, { alternative: 'less', permutations: 2000, seed: 1 }).pValue,
    ).toBeGreaterThan(0.9);
    expect(
      permutationTest(a, b, {
        statistic: 'median-difference',
        alternative: 'greater',
        permutations: 2000,
        seed: 1,
      }).pValue,
    ).toBeLessThan(0.01);
    // the +1 correction: never below 1/(permutations + 1)
    expect(
      permutationTest(a, b, { alternative: 'greater', permutations: 99, seed: 1 }).pValue,
    ).toBeCloseTo(0.01, 12);
  });
});

describe('sign-flip test', () => {
  it('agrees with the exact enumeration of all 2^n sign patterns', () => {
    // brute-force oracle: 2^10 sign patterns
    const d = [0.3, -0.1, 0.5, 0.2, 0.45, -0.05, 0.25, 0.6, -0.2, 0.15];
    const obs = d.reduce((s, x) => s + x, 0);
    let count = 0;
    for (let mask = 0; mask < 1 << d.length; mask++) {
      let s = 0;
      for (let i = 0; i < d.length; i++) s += mask & (1 << i) ? -d[i] : d[i];
      if (s >= obs - 1e-12) count++;
    }
    const exact = count / (1 << d.length);
    const mc = signFlipTest(d, { alternative: 'greater', permutations: 50_000, seed: 2 });
    expect(Math.abs(mc.pValue - exact)).toBeLessThan(0.004);
  });

  it('detects gas upstream of stars and not its absence', () => {
    // paired offsets: stars 0.1 kpc ahead of gas with 0.1 kpc scatter, n = 30 (power ≈ 1)
    const rng = makeRng(4);
    const ahead = Float64Array.from({ length: 30 }, () => 0.1 + 0.1 * rng.normal());
    const none = Float64Array.from({ length: 30 }, () => 0.1 * rng.normal());
    expect(signFlipTest(ahead, { alternative: 'greater', seed: 1 }).pValue).toBeLessThan(0.001);
    expect(signFlipTest(none, { alternative: 'greater', seed: 1 }).pValue).toBeGreaterThan(0.01);
    expect(() => signFlipTest([], {})).toThrow('at least one');
  });
});
