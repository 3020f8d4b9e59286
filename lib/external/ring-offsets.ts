/**
 * Azimuthal offsets between gas and young stars, ring by ring, in the disc of a galaxy seen from
 * outside (the method of Egusa et al. 2004, PASJ 56, L45 and Tamburro et al. 2008, AJ 136,
 * 2872). In each ring the azimuthal count profiles of the two classes are cross-correlated
 * (`./cross-correlation`); the lag of the peak within one arm period (±180°/m) is Δφ = young
 * minus gas, positive when the young stars lie AHEAD of the gas in the sense of rotation.
 * Intervals: percentile bootstrap (Efron & Tibshirani 1993, ch. 13) resampling the ring's gas and
 * young sources with replacement, seeded per ring; replicate r of every ring comes from resample
 * r, so a fit over rings can use them jointly.
 *
 * Cross-check, when arms are given: the m-fold circular mean of each class's offsets from the
 * ridge at the same radius, atan2(Σ sin mδ, Σ cos mδ)/m, which a uniform background leaves
 * unbiased, and its young-minus-gas difference, bootstrapped with the same resamples.
 */
import { deriveSeed, makeRng } from '@/lib/stats/rng';
import { quantileSorted } from '@/lib/stats/summary';
import { ridgeOffsetRad } from './arms-fit';
import { azimuthBin, makeLagFinder } from './cross-correlation';
import type { Ci95, LogSpiralArms, RingSpec } from './types';

/** Class code of a source: gas, young stars, or neither. */
export const GAS = 0;
export const YOUNG = 1;
export const NEITHER = -1;

/** Options: m arms, bootstrap resamples and seed, kernel σ (rad), azimuth bins, fewest sources per class, arms for the ridge cross-check. */
export type RingOffsetOptions = {
  m: number;
  resamples: number;
  seed: number;
  kernelRad: number;
  bins: number;
  minPerClass: number;
  arms: LogSpiralArms | null;
};

/** Offsets of each class from the ridge (rad, positive ahead) and young minus gas with its interval. */
export type RidgeCheck = {
  gasRad: number;
  youngRad: number;
  youngMinusGasRad: number;
  ci95Rad: Ci95;
};

/** One ring's measurement. dphiRad is null (with a reason) when the ring cannot be measured. */
export type RingOffset = {
  minKpc: number;
  maxKpc: number;
  RKpc: number;
  nGas: number;
  nYoung: number;
  dphiRad: number | null;
  ci95Rad: Ci95 | null;
  replicatesRad: Float64Array;
  atLagLimit: boolean;
  ridge: RidgeCheck | null;
  reason: string | null;
};

/** Ring k spans [minKpc + k·widthKpc, min(maxKpc, minKpc + (k + 1)·widthKpc)). */
export function ringEdgesKpc(rings: RingSpec): Float64Array {
  const count = Math.max(1, Math.ceil((rings.maxKpc - rings.minKpc) / rings.widthKpc - 1e-9));
  return Float64Array.from({ length: count + 1 }, (_, k) =>
    Math.min(rings.maxKpc, rings.minKpc + k * rings.widthKpc),
  );
}

/** Ring index of each radius (−1 outside the rings). */
export function ringIndex(RKpc: Float64Array, edges: Float64Array): Int16Array {
  const out = new Int16Array(RKpc.length).fill(-1);
  const last = edges.length - 1;
  for (let i = 0; i < RKpc.length; i++) {
    const R = RKpc[i];
    if (!(R >= edges[0] && R < edges[last])) continue;
    let lo = 0;
    let hi = last;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (edges[mid] <= R) lo = mid;
      else hi = mid;
    }
    out[i] = lo;
  }
  return out;
}

/**
 * Δφ (young minus gas) per ring, with bootstrap replicates and intervals, for sources with disc
 * radius RKpc, azimuth phiRad (sense of rotation) and class codes {@link GAS} / {@link YOUNG} /
 * {@link NEITHER}. A ring with fewer than minPerClass sources of either class is not measured.
 */
export function ringOffsets(
  RKpc: Float64Array,
  phiRad: Float64Array,
  classCode: Int8Array,
  rings: RingSpec,
  options: RingOffsetOptions,
): RingOffset[] {
  const edges = ringEdgesKpc(rings);
  const ring = ringIndex(RKpc, edges);
  const members = groupByRing(ring, classCode, edges.length - 1);
  const finder = makeLagFinder(options.bins, options.kernelRad, Math.PI / options.m);
  return members.map(({ gas, young }, k) => {
    const base = {
      minKpc: edges[k],
      maxKpc: edges[k + 1],
      RKpc: 0.5 * (edges[k] + edges[k + 1]),
      nGas: gas.length,
      nYoung: young.length,
    };
    if (gas.length < options.minPerClass || young.length < options.minPerClass)
      return {
        ...base,
        dphiRad: null,
        ci95Rad: null,
        replicatesRad: new Float64Array(0),
        atLagLimit: false,
        ridge: null,
        reason: `fewer than ${options.minPerClass} gas or young sources`,
      };
    return {
      ...base,
      ...measureRing(gas, young, RKpc, phiRad, finder, options, deriveSeed(options.seed, k)),
    };
  });
}

/** Indices of each ring's gas and young sources. */
export function groupByRing(
  ring: Int16Array,
  classCode: Int8Array,
  count: number,
): { gas: number[]; young: number[] }[] {
  const out = Array.from({ length: count }, () => ({ gas: [] as number[], young: [] as number[] }));
  for (let i = 0; i < ring.length; i++) {
    if (ring[i] < 0) continue;
    if (classCode[i] === GAS) out[ring[i]].gas.push(i);
    else if (classCode[i] === YOUNG) out[ring[i]].young.push(i);
  }
  return out;
}

function measureRing(
  gas: number[],
  young: number[],
  RKpc: Float64Array,
  phiRad: Float64Array,
  finder: ReturnType<typeof makeLagFinder>,
  options: RingOffsetOptions,
  seed: number,
): Omit<RingOffset, 'minKpc' | 'maxKpc' | 'RKpc' | 'nGas' | 'nYoung'> {
  const bins = options.bins;
  const gasBin = Uint16Array.from(gas, (i) => azimuthBin(phiRad[i], bins));
  const youngBin = Uint16Array.from(young, (i) => azimuthBin(phiRad[i], bins));
  const gasCounts = new Float64Array(bins);
  const youngCounts = new Float64Array(bins);
  for (const b of gasBin) gasCounts[b]++;
  for (const b of youngBin) youngCounts[b]++;
  const point = finder.peakLag(gasCounts, youngCounts);

  const arms = options.arms;
  const m = options.m;
  const ridgeTerms = (idx: number[]) => {
    const c = new Float64Array(idx.length);
    const s = new Float64Array(idx.length);
    if (arms)
      idx.forEach((i, k) => {
        const d = m * ridgeOffsetRad(arms, RKpc[i], phiRad[i]);
        c[k] = Math.cos(d);
        s[k] = Math.sin(d);
      });
    return { c, s };
  };
  const gasRidge = ridgeTerms(gas);
  const youngRidge = ridgeTerms(young);
  const sum = (a: Float64Array) => a.reduce((t, x) => t + x, 0);
  const ridgeGas = Math.atan2(sum(gasRidge.s), sum(gasRidge.c)) / m;
  const ridgeYoung = Math.atan2(sum(youngRidge.s), sum(youngRidge.c)) / m;
  const ridgeDiff = wrapArmPeriod(ridgeYoung - ridgeGas, m);

  const resamples = options.resamples;
  const replicatesRad = new Float64Array(resamples);
  const ridgeReplicates = new Float64Array(arms ? resamples : 0);
  const rng = makeRng(seed);
  let failed = 0;
  for (let r = 0; r < resamples; r++) {
    gasCounts.fill(0);
    youngCounts.fill(0);
    let gc = 0;
    let gs = 0;
    let yc = 0;
    let ys = 0;
    for (let k = 0; k < gas.length; k++) {
      const j = rng.int(gas.length);
      gasCounts[gasBin[j]]++;
      gc += gasRidge.c[j];
      gs += gasRidge.s[j];
    }
    for (let k = 0; k < young.length; k++) {
      const j = rng.int(young.length);
      youngCounts[youngBin[j]]++;
      yc += youngRidge.c[j];
      ys += youngRidge.s[j];
    }
    const lag = finder.peakLag(gasCounts, youngCounts).lagRad;
    if (!Number.isFinite(lag)) failed++;
    replicatesRad[r] = lag;
    if (arms)
      ridgeReplicates[r] =
        ridgeDiff + wrapArmPeriod(Math.atan2(ys, yc) / m - Math.atan2(gs, gc) / m - ridgeDiff, m);
  }
  const ridge: RidgeCheck | null = arms
    ? {
        gasRad: ridgeGas,
        youngRad: ridgeYoung,
        youngMinusGasRad: ridgeDiff,
        ci95Rad: percentile95(ridgeReplicates),
      }
    : null;
  if (!Number.isFinite(point.lagRad) || failed > 0)
    return {
      dphiRad: null,
      ci95Rad: null,
      replicatesRad,
      atLagLimit: false,
      ridge,
      reason: 'the azimuthal profiles are flat: no correlation peak',
    };
  return {
    dphiRad: point.lagRad,
    ci95Rad: percentile95(replicatesRad),
    replicatesRad,
    atLagLimit: point.atLimit,
    ridge,
    reason: point.atLimit ? `the correlation peak lies at the ±${180 / m}° limit` : null,
  };
}

/** Wraps an angle (rad) into [−π/m, π/m), one arm period. */
function wrapArmPeriod(angle: number, m: number): number {
  const period = (2 * Math.PI) / m;
  const t = angle / period + 0.5;
  return (t - Math.floor(t) - 0.5) * period;
}

function percentile95(values: Float64Array): Ci95 {
  const sorted = Float64Array.from(values).sort();
  return [quantileSorted(sorted, 0.025), quantileSorted(sorted, 0.975)];
}
