/**
 * Monte Carlo permutation tests (Fisher 1935; Good 2005), seeded. p-values include the observed
 * arrangement: p = (1 + #{T* at least as extreme as T}) / (1 + permutations) (Davison & Hinkley
 * 1997, §4.3; Phipson & Smyth 2010), so they are never zero and the test keeps its level.
 * "At least as extreme" allows a relative tolerance of 1e-12 for rounding in re-ordered sums.
 */

import { makeRng } from './rng';
import { mean, median } from './summary';

/** Direction of the alternative hypothesis. */
export type Alternative = 'greater' | 'less' | 'two-sided';

/** Two-sample statistic: a named difference (a − b) or a function of the two samples. */
export type TwoSampleStatistic =
  'mean-difference' | 'median-difference' | ((a: Float64Array, b: Float64Array) => number);

/** Observed statistic and permutation p-value. */
export type TestResult = { observed: number; pValue: number; permutations: number };

function twoSampleFunction(
  statistic: TwoSampleStatistic,
): (a: Float64Array, b: Float64Array) => number {
  if (statistic === 'mean-difference') return (a, b) => mean(a) - mean(b);
  if (statistic === 'median-difference') return (a, b) => median(a) - median(b);
  return statistic;
}

function checkCount(permutations: number): void {
  if (!Number.isInteger(permutations) || permutations < 1) {
    throw new RangeError(`permutations = ${permutations} must be a positive integer`);
  }
}

function extremeCounter(observed: number, alternative: Alternative): (t: number) => boolean {
  const tol = 1e-12 * Math.max(1, Math.abs(observed));
  if (alternative === 'greater') return (t) => t >= observed - tol;
  if (alternative === 'less') return (t) => t <= observed + tol;
  return (t) => Math.abs(t) >= Math.abs(observed) - tol;
}

/**
 * Two-sample permutation test of "a and b come from the same distribution" against a shift in
 * the direction of `alternative` for the statistic (default the mean difference a − b):
 * randomly reassigns the pooled values to groups of the original sizes `permutations` times
 * (default 9999) and counts statistics at least as extreme as the observed one.
 */
export function permutationTest(
  a: Float64Array | number[],
  b: Float64Array | number[],
  options: {
    statistic?: TwoSampleStatistic;
    alternative?: Alternative;
    permutations?: number;
    seed?: number;
  } = {},
): TestResult {
  const permutations = options.permutations ?? 9999;
  checkCount(permutations);
  if (a.length === 0 || b.length === 0)
    throw new RangeError('permutation test needs two non-empty samples');
  const f = twoSampleFunction(options.statistic ?? 'mean-difference');
  const pooled = Float64Array.from([...a, ...b]);
  const na = a.length;
  const observed = f(pooled.subarray(0, na), pooled.subarray(na));
  const extreme = extremeCounter(observed, options.alternative ?? 'two-sided');
  const rng = makeRng(options.seed ?? 1);
  const work = pooled.slice();
  let count = 0;
  for (let p = 0; p < permutations; p++) {
    // Partial Fisher–Yates: the first na slots become a uniform random subset.
    for (let i = 0; i < na; i++) {
      const j = i + rng.int(work.length - i);
      const t = work[i];
      work[i] = work[j];
      work[j] = t;
    }
    if (extreme(f(work.subarray(0, na), work.subarray(na)))) count++;
  }
  return { observed, pValue: (count + 1) / (permutations + 1), permutations };
}

/**
 * One-sample sign-flip (randomisation) test on paired differences (Fisher 1935): under the null
 * the differences are symmetric about zero, so each sign is flipped at random `permutations`
 * times (default 9999). Use it for "gas upstream of young stars" with diffs = star offset − gas
 * offset per complex and alternative 'greater'. Statistic: 'mean' (default) or 'median' of the
 * differences, or a function.
 */
export function signFlipTest(
  diffs: Float64Array | number[],
  options: {
    statistic?: 'mean' | 'median' | ((xs: Float64Array) => number);
    alternative?: Alternative;
    permutations?: number;
    seed?: number;
  } = {},
): TestResult {
  const permutations = options.permutations ?? 9999;
  checkCount(permutations);
  if (diffs.length === 0) throw new RangeError('sign-flip test needs at least one difference');
  const stat = options.statistic ?? 'mean';
  const f = stat === 'mean' ? mean : stat === 'median' ? median : stat;
  const data = Float64Array.from(diffs);
  const observed = f(data);
  const extreme = extremeCounter(observed, options.alternative ?? 'two-sided');
  const rng = makeRng(options.seed ?? 1);
  const work = new Float64Array(data.length);
  let count = 0;
  for (let p = 0; p < permutations; p++) {
    for (let i = 0; i < data.length; i++) work[i] = rng.next() < 0.5 ? -data[i] : data[i];
    if (extreme(f(work))) count++;
  }
  return { observed, pValue: (count + 1) / (permutations + 1), permutations };
}
