import { describe, expect, it } from 'vitest';
import { deriveSeed, makeRng } from '@/lib/stats/rng';
import { mean, median, quantile, quantileSorted, standardDeviation } from '@/lib/stats/summary';

describe('seeded generator', () => {
  it('is reproducible and seed-dependent', () => {
    // determinism of a seeded PRNG
    const a = makeRng(123);
    const b = makeRng(123);
    const c = makeRng(124);
    const xs = Array.from({ length: 10 }, () => a.next());
    expect(Array.from({ length: 10 }, () => b.next())).toEqual(xs);
    expect(Array.from({ length: 10 }, () => c.next())).not.toEqual(xs);
    expect(deriveSeed(1, 0)).not.toBe(deriveSeed(1, 1));
    expect(deriveSeed(1, 5)).toBe(deriveSeed(1, 5));
  });

  it('gives uniform and normal deviates with the right moments', () => {
    // U(0,1): mean 1/2, variance 1/12; N(0,1): mean 0, sd 1 — tolerances ≈ 5 standard errors
    const rng = makeRng(99);
    const n = 200_000;
    const u = Float64Array.from({ length: n }, () => rng.next());
    expect(Math.abs(mean(u) - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(u.every((x) => x >= 0 && x < 1)).toBe(true);
    const z = Float64Array.from({ length: n }, () => rng.normal());
    expect(Math.abs(mean(z))).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(standardDeviation(z) - 1)).toBeLessThan(5 / Math.sqrt(2 * n));
    // P(|Z| > 1.96) = 0.05 (standard normal table)
    const tail = z.filter((x) => Math.abs(x) > 1.959964).length / n;
    expect(Math.abs(tail - 0.05)).toBeLessThan(5 * Math.sqrt((0.05 * 0.95) / n));
    const counts = new Array(7).fill(0);
    for (let i = 0; i < 70_000; i++) counts[rng.int(7)]++;
    for (const c of counts) expect(Math.abs(c - 10_000)).toBeLessThan(500);
  });
});

describe('summary statistics', () => {
  it('uses the type-7 quantile rule', () => {
    // R quantile(c(1,2,3,4), 0.25) = 1.75 and quantile(1:10, 0.9) = 9.1 (Hyndman & Fan 1996 type 7; from memory)
    expect(quantile([4, 1, 3, 2], 0.25)).toBeCloseTo(1.75, 12);
    expect(quantile([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 0.9)).toBeCloseTo(9.1, 12);
    expect(median([5, 1, 3])).toBe(3);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(quantileSorted([1, 2], 0)).toBe(1);
    expect(quantileSorted([1, 2], 1)).toBe(2);
    expect(mean([1, 2, 3, 4])).toBe(2.5);
    expect(() => median([])).toThrow('empty');
    expect(() => quantile([1], 1.5)).toThrow('1.5');
  });
});
