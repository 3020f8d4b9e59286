/**
 * Sampling helpers on top of the project's seeded generator (`@/lib/stats/rng`): uniform on an
 * interval, log-normal, Poisson and a Bernoulli draw. Pure functions of the generator state, so
 * a seed fixes every draw.
 */
import type { Rng } from '@/lib/stats/rng';

export type { Rng };

/** Uniform draw on [lo, hi). */
export function uniform(rng: Rng, lo: number, hi: number): number {
  return lo + (hi - lo) * rng.next();
}

/** Log-normal draw with the given median and natural-log standard deviation. */
export function logNormal(rng: Rng, median: number, sigmaLn: number): number {
  return median * Math.exp(sigmaLn * rng.normal());
}

/** True with probability p. */
export function bernoulli(rng: Rng, p: number): boolean {
  return rng.next() < p;
}

/**
 * Poisson draw with mean λ (Knuth's multiplication method; λ here stays below ~10, where it is
 * exact and fast). λ ≤ 0 gives 0.
 */
export function poisson(rng: Rng, lambda: number): number {
  if (!(lambda > 0)) return 0;
  const limit = Math.exp(-lambda);
  let k = 0;
  let p = rng.next();
  while (p > limit) {
    k++;
    p *= rng.next();
  }
  return k;
}
