/**
 * The headline test of ordering (SCIENCE.md §6): is the young-star centroid of a complex
 * downstream of its gas centroid across the arm? Each complex with gas and young-star members
 * contributes a = s · across, its across-arm gas→stars offset (kpc, positive ahead) times its
 * flow sign s = sign(Ω(R) − Ω_p) (+1 inside corotation, −1 outside; complexes whose side is not
 * known are left out). Density-wave theory predicts a > 0 everywhere (Roberts 1969): inside
 * corotation the stars lie ahead of the gas, outside behind it.
 *
 * p-value: one-sided sign-flip randomisation test of the median of a (Fisher 1935; via
 * `signFlipTest` of `@/lib/stats/permutation`): under the null "no ordering" each a is
 * symmetric about 0, so its sign is flipped at random; p = (1 + #{median* ≥ observed}) /
 * (1 + permutations). Signing by s cannot create a signal under that null, because s does not
 * depend on the sign of a.
 *
 * KS: two-sample Kolmogorov–Smirnov test (`ksTwoSample`) of the per-complex gas-centroid versus
 * young-star-centroid offsets from the ridge (signed by s), one value per complex and group, so
 * that the samples are made of independent complexes rather than of correlated members.
 */
import { ksTwoSample } from '@/lib/stats/ks';
import { signFlipTest } from '@/lib/stats/permutation';
import { median, quantileSelectInPlace } from '@/lib/stats/summary';
import { bootstrapCenters } from './cluster-bootstrap';
import { isGasKind, isYoungKind } from './members';
import type { OrderingResult } from './types';

/** Values of the complexes that enter the gas→stars statistics, in complex order. */
export type SignedGasToStars = {
  complex: Int32Array;
  acrossKpc: Float64Array;
  alongKpc: Float64Array;
};

/** Collects s · across and s · along of the used complexes with s ≠ 0 and a finite across part. */
export function signedGasToStars(
  acrossKpc: Float64Array,
  alongKpc: Float64Array,
  used: Uint8Array,
  flowSign: Int8Array,
): SignedGasToStars {
  const idx: number[] = [];
  for (let c = 0; c < acrossKpc.length; c++)
    if (used[c] && flowSign[c] !== 0 && acrossKpc[c] === acrossKpc[c]) idx.push(c);
  const complex = Int32Array.from(idx);
  return {
    complex,
    acrossKpc: Float64Array.from(idx, (c) => flowSign[c] * acrossKpc[c]),
    alongKpc: Float64Array.from(idx, (c) => flowSign[c] * alongKpc[c]),
  };
}

/** Median, bootstrap 95 % interval, mean, median along-arm part and sign-flip p-value of {@link SignedGasToStars}. */
export function gasToStarsSummary(
  g: SignedGasToStars,
  resamples: number,
  bootstrapSeed: number,
  testSeed: number,
): OrderingResult['gasToStars'] {
  const n = g.acrossKpc.length;
  const b = bootstrapCenters(g.acrossKpc, resamples, bootstrapSeed);
  if (!b)
    return {
      n,
      medianAcrossKpc: null,
      ci95: null,
      meanAcrossKpc: null,
      medianAlongKpc: null,
      pValue: null,
    };
  const test = signFlipTest(g.acrossKpc, {
    statistic: (xs) => quantileSelectInPlace(xs, 0.5),
    alternative: 'greater',
    permutations: resamples,
    seed: testSeed,
  });
  return {
    n,
    medianAcrossKpc: b.median,
    ci95: b.medianCi,
    meanAcrossKpc: b.mean,
    medianAlongKpc: median(g.alongKpc),
    pValue: test.pValue,
  };
}

/**
 * KS test of gas versus young-star centroid offsets (kpc, member perpendicular offsets averaged
 * per complex and signed by s) over the used complexes with s ≠ 0; null when either side is empty.
 */
export function centroidOffsetKs(
  start: Int32Array,
  kind: Uint8Array,
  memberPerpKpc: Float64Array,
  used: Uint8Array,
  flowSign: Int8Array,
): { d: number; pValue: number } | null {
  const gas: number[] = [];
  const young: number[] = [];
  for (let c = 0; c + 1 < start.length; c++) {
    if (!used[c] || flowSign[c] === 0) continue;
    let gSum = 0;
    let gN = 0;
    let ySum = 0;
    let yN = 0;
    for (let i = start[c]; i < start[c + 1]; i++) {
      if (isGasKind(kind[i])) {
        gSum += memberPerpKpc[i];
        gN++;
      } else if (isYoungKind(kind[i])) {
        ySum += memberPerpKpc[i];
        yN++;
      }
    }
    if (gN > 0) gas.push((flowSign[c] * gSum) / gN);
    if (yN > 0) young.push((flowSign[c] * ySum) / yN);
  }
  if (gas.length === 0 || young.length === 0) return null;
  const r = ksTwoSample(gas, young);
  return { d: r.d, pValue: r.pValue };
}
