/**
 * The offset of young stars from the gas of their own complex (docs/methods.md, "Within
 * complexes"). Members are linked within the link radius, so this offset is bounded by that
 * radius — a few pc — and measures how young stars sit on their parent cloud, not the ordering
 * across an arm (100–300 pc); no delay is derived from it. The bound is stated beside it: the
 * link radius in pc at the 5th and 95th percentile distance of the used complexes.
 */
import { signFlipTest } from '@/lib/stats/permutation';
import { median, quantile, quantileSelectInPlace } from '@/lib/stats/summary';
import { bootstrapCenters } from './cluster-bootstrap';
import type { IntraComplex } from './types';

const ARCSEC = Math.PI / 180 / 3600;

/**
 * Summary of the used complexes' across (kpc, positive when the young stars lie ahead of their
 * gas) and along offsets; `distKpc` are the complexes' median distances.
 */
export function intraComplexSummary(
  acrossKpc: Float64Array,
  alongKpc: Float64Array,
  distKpc: Float64Array,
  used: Int32Array,
  linkRadiusArcsec: [number, number] | null,
  resamples: number,
  bootstrapSeed: number,
  testSeed: number,
): IntraComplex {
  const idx = Array.from(used).filter((c) => Number.isFinite(acrossKpc[c]));
  const across = Float64Array.from(idx, (c) => acrossKpc[c]);
  const dists = Array.from(used, (c) => distKpc[c]).filter((d) => d > 0);
  const linkRadiusPc: [number, number] | null =
    linkRadiusArcsec && dists.length > 0
      ? [
          linkRadiusArcsec[0] * ARCSEC * quantile(dists, 0.05) * 1000,
          linkRadiusArcsec[1] * ARCSEC * quantile(dists, 0.95) * 1000,
        ]
      : null;
  const b = bootstrapCenters(across, resamples, bootstrapSeed);
  if (!b)
    return {
      n: 0,
      medianAcrossKpc: null,
      ci95: null,
      medianAlongKpc: null,
      pValue: null,
      linkRadiusPc,
    };
  const test = signFlipTest(across, {
    statistic: (xs) => quantileSelectInPlace(xs, 0.5),
    alternative: 'two-sided',
    permutations: resamples,
    seed: testSeed,
  });
  return {
    n: across.length,
    medianAcrossKpc: b.median,
    ci95: b.medianCi,
    medianAlongKpc: median(Float64Array.from(idx, (c) => alongKpc[c])),
    pValue: test.pValue,
    linkRadiusPc,
  };
}
