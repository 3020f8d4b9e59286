import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { bootstrapCi } from '@/lib/stats/bootstrap';
import { makeRng } from '@/lib/stats/rng';
import { mean, median, standardDeviation } from '@/lib/stats/summary';

describe('percentile bootstrap', () => {
  const rng = makeRng(314);
  const n = 400;
  const xs = Float64Array.from({ length: n }, () => 3 + 2 * rng.normal());

  it('matches the analytic normal-mean interval mean ± 1.96 σ/√n', () => {
    // normal theory: x̄ ± z_0.975 s/√n, z from jstat's normal quantile (1.959964, standard normal table)
    const z = jStat.normal.inv(0.975, 0, 1);
    expect(z).toBeCloseTo(1.959964, 5);
    const half = (z * standardDeviation(xs)) / Math.sqrt(n);
    const ci = bootstrapCi(xs, 'mean', { resamples: 4000, seed: 1 });
    expect(ci.estimate).toBe(mean(xs));
    expect(ci.resamples).toBe(4000);
    // the percentile bootstrap under-covers by ~(n−1)/n and has Monte Carlo noise: allow 10 %
    expect(Math.abs(ci.lo - (mean(xs) - half))).toBeLessThan(0.1 * half);
    expect(Math.abs(ci.hi - (mean(xs) + half))).toBeLessThan(0.1 * half);
  });

  it('gives a median interval near the asymptotic one', () => {
    // asymptotic sd of the sample median of N(μ, σ²): σ √(π/(2n)) (common practice)
    const ci = bootstrapCi(xs, 'median', { seed: 2 });
    const half = jStat.normal.inv(0.975, 0, 1) * 2 * Math.sqrt(Math.PI / (2 * n));
    expect(ci.estimate).toBe(median(xs));
    expect(ci.hi - ci.lo).toBeGreaterThan(0.6 * 2 * half);
    expect(ci.hi - ci.lo).toBeLessThan(1.5 * 2 * half);
    expect(ci.lo).toBeLessThan(ci.estimate);
    expect(ci.hi).toBeGreaterThan(ci.estimate);
  });

  it('is reproducible, accepts custom statistics and levels, and rejects bad input', () => {
    // determinism and option handling
    expect(bootstrapCi(xs, 'mean', { seed: 5 })).toEqual(
      bootstrapCi(Array.from(xs), 'mean', { seed: 5 }),
    );
    const wide = bootstrapCi(xs, (s) => Math.max(...s) - Math.min(...s), {
      seed: 3,
      level: 0.99,
      resamples: 500,
    });
    expect(wide.lo).toBeLessThanOrEqual(wide.hi);
    const narrow = bootstrapCi(xs, 'mean', { seed: 4, level: 0.5 });
    const full = bootstrapCi(xs, 'mean', { seed: 4 });
    expect(narrow.hi - narrow.lo).toBeLessThan(full.hi - full.lo);
    expect(() => bootstrapCi([], 'mean')).toThrow('empty');
    expect(() => bootstrapCi(xs, 'mean', { level: 1 })).toThrow('level');
    expect(() => bootstrapCi(xs, () => Number.NaN, { resamples: 3 })).toThrow('non-finite');
  });
});
