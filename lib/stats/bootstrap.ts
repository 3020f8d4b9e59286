/**
 * Percentile bootstrap confidence intervals (Efron 1979; Efron & Tibshirani 1993, ch. 13),
 * seeded so that a result can be reproduced.
 */

import { makeRng } from './rng';
import { mean, median, quantileSorted } from './summary';

/** A statistic of one sample: a name for the usual ones, or a function of the (resampled) values. */
export type SampleStatistic = 'median' | 'mean' | ((xs: Float64Array) => number);

/** Options: number of resamples (default 2000), seed (default 1), confidence level (default 0.95). */
export type BootstrapOptions = { resamples?: number; seed?: number; level?: number };

/** Estimate on the original sample and the percentile interval [lo, hi] from the resamples. */
export type BootstrapResult = { estimate: number; lo: number; hi: number; resamples: number };

/** The function behind a {@link SampleStatistic}. */
export function statisticFunction(statistic: SampleStatistic): (xs: Float64Array) => number {
  if (statistic === 'median') return median;
  if (statistic === 'mean') return mean;
  return statistic;
}

/**
 * Percentile bootstrap interval of a statistic: draws `resamples` samples of the same size with
 * replacement, computes the statistic on each, and returns the (1 − level)/2 and (1 + level)/2
 * quantiles (type 7) of those values, with the statistic of the original sample as `estimate`.
 * Throws RangeError for an empty sample or bad options; resamples whose statistic is not finite
 * are an error (they would bias the interval silently).
 */
export function bootstrapCi(
  values: Float64Array | number[],
  statistic: SampleStatistic,
  options: BootstrapOptions = {},
): BootstrapResult {
  const resamples = options.resamples ?? 2000;
  const level = options.level ?? 0.95;
  const n = values.length;
  if (n === 0) throw new RangeError('bootstrap of an empty sample');
  if (!Number.isInteger(resamples) || resamples < 1)
    throw new RangeError(`resamples = ${resamples} must be a positive integer`);
  if (!(level > 0 && level < 1)) throw new RangeError(`level = ${level} must lie in (0, 1)`);
  const data = Float64Array.from(values);
  const f = statisticFunction(statistic);
  const rng = makeRng(options.seed ?? 1);
  const sample = new Float64Array(n);
  const stats = new Float64Array(resamples);
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < n; i++) sample[i] = data[rng.int(n)];
    const s = f(sample);
    if (!Number.isFinite(s))
      throw new RangeError(`bootstrap resample ${r + 1} gave a non-finite statistic (${s})`);
    stats[r] = s;
  }
  stats.sort();
  const alpha = (1 - level) / 2;
  return {
    estimate: f(data),
    lo: quantileSorted(stats, alpha),
    hi: quantileSorted(stats, 1 - alpha),
    resamples,
  };
}
