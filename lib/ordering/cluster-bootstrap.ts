/**
 * Percentile bootstrap of the median and the mean (Efron 1979; Efron & Tibshirani 1993, ch. 13)
 * that resamples clusters rather than single values: members of one complex share its distance
 * and its place in the arm, so they are not independent, and the complex is the unit that is
 * drawn with replacement (the cluster bootstrap, Davison & Hinkley 1997, §3.8). With one value
 * per cluster it is the ordinary bootstrap.
 *
 * Fast path: values are sorted once; a resample is a vector of cluster multiplicities, so the
 * resampled mean is a weighted sum of cluster sums and the resampled median (type 7, as in
 * `@/lib/stats/summary`) is found by one cumulative-weight scan of the sorted values. No
 * allocation per resample.
 */
import { makeRng } from '@/lib/stats/rng';
import { quantileSorted } from '@/lib/stats/summary';
import type { Ci } from './types';

/** Median and mean of a sample with their 95 % percentile-bootstrap intervals. */
export type CenterSummary = { median: number; mean: number; medianCi: Ci; meanCi: Ci };

/** Confidence level of every interval in the analysis. */
export const CI_LEVEL = 0.95;

/**
 * Cluster bootstrap of the median and mean of `values` (any finite numbers), where value i
 * belongs to cluster `cluster[i]` (any integers): `resamples` resamples of the clusters with
 * replacement, seeded by `seed`. Returns null for an empty sample; throws RangeError for
 * mismatched lengths or a non-finite value (naming its position).
 */
export function clusterBootstrap(
  values: Float64Array,
  cluster: Int32Array,
  resamples: number,
  seed: number,
): CenterSummary | null {
  const n = values.length;
  if (cluster.length !== n)
    throw new RangeError(`values (${n}) and clusters (${cluster.length}) differ in length`);
  if (n === 0) return null;
  const ids = new Map<number, number>();
  const clusterOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i]))
      throw new RangeError(`bootstrap value ${i + 1} is ${values[i]}`);
    let id = ids.get(cluster[i]);
    if (id === undefined) {
      id = ids.size;
      ids.set(cluster[i], id);
    }
    clusterOf[i] = id;
  }
  const nc = ids.size;
  const order = Uint32Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b]);
  const sorted = new Float64Array(n);
  const sortedCluster = new Int32Array(n);
  const clusterSum = new Float64Array(nc);
  const clusterCount = new Int32Array(nc);
  for (let k = 0; k < n; k++) {
    const i = order[k];
    sorted[k] = values[i];
    sortedCluster[k] = clusterOf[i];
    clusterSum[clusterOf[i]] += values[i];
    clusterCount[clusterOf[i]]++;
  }
  const weights = new Int32Array(nc);
  const medians = new Float64Array(resamples);
  const means = new Float64Array(resamples);
  const rng = makeRng(seed);
  for (let r = 0; r < resamples; r++) {
    weights.fill(0);
    for (let k = 0; k < nc; k++) weights[Math.floor(rng.next() * nc)]++;
    let total = 0;
    let sum = 0;
    for (let c = 0; c < nc; c++) {
      const w = weights[c];
      if (w === 0) continue;
      total += w * clusterCount[c];
      sum += w * clusterSum[c];
    }
    means[r] = sum / total;
    medians[r] = weightedMedian(sorted, sortedCluster, weights, total);
  }
  medians.sort();
  means.sort();
  const a = (1 - CI_LEVEL) / 2;
  const unit = new Int32Array(nc).fill(1);
  return {
    median: weightedMedian(sorted, sortedCluster, unit, n),
    mean: clusterSum.reduce((s, x) => s + x, 0) / n,
    medianCi: [quantileSorted(medians, a), quantileSorted(medians, 1 - a)],
    meanCi: [quantileSorted(means, a), quantileSorted(means, 1 - a)],
  };
}

/** Type-7 median of sorted values repeated by their clusters' weights (total = Σ weights). */
function weightedMedian(
  sorted: Float64Array,
  sortedCluster: Int32Array,
  weights: Int32Array,
  total: number,
): number {
  const h = (total - 1) / 2;
  const lo = Math.floor(h);
  const frac = h - lo;
  let cum = 0;
  let i = 0;
  for (; i < sorted.length; i++) {
    cum += weights[sortedCluster[i]];
    if (cum > lo) break;
  }
  const vLo = sorted[i];
  if (frac === 0 || cum > lo + 1) return vLo;
  for (i++; i < sorted.length; i++) if (weights[sortedCluster[i]] > 0) break;
  return vLo + frac * (sorted[i] - vLo);
}

/** {@link clusterBootstrap} with every value its own cluster: the ordinary percentile bootstrap. */
export function bootstrapCenters(
  values: Float64Array,
  resamples: number,
  seed: number,
): CenterSummary | null {
  return clusterBootstrap(
    values,
    Int32Array.from({ length: values.length }, (_, i) => i),
    resamples,
    seed,
  );
}
