import { describe, expect, it } from 'vitest';
import { kolmogorovSurvival, ksTwoSample } from '@/lib/stats/ks';
import { makeRng } from '@/lib/stats/rng';

/** D by brute force: the ECDF difference evaluated at every pooled value. */
function bruteD(a: number[], b: number[]): number {
  let d = 0;
  for (const x of [...a, ...b]) {
    const fa = a.filter((v) => v <= x).length / a.length;
    const fb = b.filter((v) => v <= x).length / b.length;
    d = Math.max(d, Math.abs(fa - fb));
  }
  return d;
}

describe('Kolmogorov distribution', () => {
  it('reproduces the classical critical values', () => {
    // asymptotic critical values c(α): 1.224 (10 %), 1.358 (5 %), 1.628 (1 %) (Smirnov 1948 table; from memory)
    expect(kolmogorovSurvival(1.2238)).toBeCloseTo(0.1, 3);
    expect(kolmogorovSurvival(1.3581)).toBeCloseTo(0.05, 3);
    expect(kolmogorovSurvival(1.6276)).toBeCloseTo(0.01, 3);
    expect(kolmogorovSurvival(0)).toBe(1);
    expect(kolmogorovSurvival(0.1)).toBeCloseTo(1, 12);
    // continuity across the switch between the two series at λ = 0.2
    expect(Math.abs(kolmogorovSurvival(0.19999) - kolmogorovSurvival(0.20001))).toBeLessThan(1e-6);
  });
});

describe('two-sample KS test', () => {
  it('computes D exactly, with ties', () => {
    // brute-force oracle
    const rng = makeRng(8);
    for (let r = 0; r < 50; r++) {
      const a = Array.from({ length: 5 + rng.int(20) }, () => Math.round(rng.normal() * 4) / 2);
      const b = Array.from(
        { length: 5 + rng.int(20) },
        () => Math.round(rng.normal() * 4) / 2 + 0.5,
      );
      expect(ksTwoSample(a, b).d).toBeCloseTo(bruteD(a, b), 12);
    }
    expect(ksTwoSample([1, 2, 3], [1, 2, 3]).d).toBe(0);
    expect(ksTwoSample([1, 2, 3], [4, 5, 6])).toMatchObject({ d: 1 });
  });

  it('agrees with the permutation distribution of D', () => {
    // brute-force oracle: the null distribution of D from 10 000 random splits of the pooled sample
    const rng = makeRng(21);
    const n = 60;
    const x = Array.from({ length: n }, () => rng.normal());
    const y = Array.from({ length: n }, () => rng.normal() + 0.3);
    const ks = ksTwoSample(x, y);
    const pooled = [...x, ...y];
    let count = 0;
    const trials = 10_000;
    for (let r = 0; r < trials; r++) {
      const w = pooled.slice();
      for (let i = 0; i < n; i++) {
        const j = i + rng.int(2 * n - i);
        [w[i], w[j]] = [w[j], w[i]];
      }
      if (ksTwoSample(w.slice(0, n), w.slice(n)).d >= ks.d - 1e-12) count++;
    }
    const permP = count / trials;
    expect(ks.pValue).toBeGreaterThan(0.05);
    expect(Math.abs(ks.pValue - permP)).toBeLessThan(0.03);
    expect(ks.pValue).toBeLessThan(permP + 0.01);
  });

  it('separates different distributions and not equal ones', () => {
    // shift of one sigma with n = m = 200 → p ≪ 0.001; same distribution → p well above 0.001
    const rng = makeRng(12);
    const x = Array.from({ length: 200 }, () => rng.normal());
    const y = Array.from({ length: 200 }, () => rng.normal() + 1);
    const z = Array.from({ length: 200 }, () => rng.normal());
    expect(ksTwoSample(x, y).pValue).toBeLessThan(1e-6);
    expect(ksTwoSample(x, z).pValue).toBeGreaterThan(0.001);
    expect(() => ksTwoSample([], [1])).toThrow('non-empty');
    expect(() => ksTwoSample([Number.NaN], [1])).toThrow('NaN');
  });
});
