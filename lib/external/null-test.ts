/**
 * Permutation test of "gas and young stars share one azimuthal distribution in every ring" (no
 * offset anywhere): the class labels are exchanged at random within each ring, keeping its gas
 * and young counts (Fisher 1935; Good 2005), and the ring offsets are measured again. The
 * statistic is the weighted mean |Δφ| over the measured rings, with weights
 * nGas·nYoung/(nGas + nYoung) (the effective size of a two-sample comparison). The p-value counts
 * the observed arrangement: p = (1 + #{T* ≥ T}) / (1 + permutations) (Davison & Hinkley 1997,
 * §4.3; Phipson & Smyth 2010).
 */
import { deriveSeed, makeRng } from '@/lib/stats/rng';
import { azimuthBin, makeLagFinder } from './cross-correlation';
import { groupByRing, ringEdgesKpc, ringIndex } from './ring-offsets';
import type { RingSpec } from './types';

/** What the null test measured. */
export type RingNullTest = {
  statistic: 'weighted mean |Δφ|';
  observedRad: number;
  pValue: number;
  permutations: number;
  rings: number;
};

/** Options: m arms, permutations and seed, kernel σ (rad), azimuth bins, fewest sources per class. */
export type RingNullTestOptions = {
  m: number;
  permutations: number;
  seed: number;
  kernelRad: number;
  bins: number;
  minPerClass: number;
};

/** The test over the rings (same inputs as `ringOffsets`); null when no ring can be measured. */
export function ringNullTest(
  RKpc: Float64Array,
  phiRad: Float64Array,
  classCode: Int8Array,
  rings: RingSpec,
  options: RingNullTestOptions,
): RingNullTest | null {
  const edges = ringEdgesKpc(rings);
  const groups = groupByRing(ringIndex(RKpc, edges), classCode, edges.length - 1).filter(
    (g) => g.gas.length >= options.minPerClass && g.young.length >= options.minPerClass,
  );
  if (groups.length === 0) return null;
  const finder = makeLagFinder(options.bins, options.kernelRad, Math.PI / options.m);
  const gasCounts = new Float64Array(options.bins);
  const youngCounts = new Float64Array(options.bins);
  const pooled = groups.map((g) =>
    Uint16Array.from([...g.gas, ...g.young], (i) => azimuthBin(phiRad[i], options.bins)),
  );
  const weights = groups.map(
    (g) => (g.gas.length * g.young.length) / (g.gas.length + g.young.length),
  );
  const totalWeight = weights.reduce((s, w) => s + w, 0);

  // The first nGas entries of a ring's pooled bins are its gas, the rest its young stars.
  const statistic = (): number => {
    let t = 0;
    groups.forEach((g, k) => {
      const bins = pooled[k];
      gasCounts.fill(0);
      youngCounts.fill(0);
      for (let j = 0; j < g.gas.length; j++) gasCounts[bins[j]]++;
      for (let j = g.gas.length; j < bins.length; j++) youngCounts[bins[j]]++;
      const lag = finder.peakLag(gasCounts, youngCounts).lagRad;
      t += weights[k] * (Number.isFinite(lag) ? Math.abs(lag) : 0);
    });
    return t / totalWeight;
  };

  const observed = statistic();
  const rng = makeRng(deriveSeed(options.seed, 0));
  const tolerance = 1e-12 * Math.max(1, observed);
  let extreme = 0;
  for (let p = 0; p < options.permutations; p++) {
    groups.forEach((g, k) => {
      const bins = pooled[k];
      // Partial Fisher–Yates: a uniformly random choice of which pooled sources are gas.
      for (let j = 0; j < g.gas.length; j++) {
        const pick = j + rng.int(bins.length - j);
        const t = bins[j];
        bins[j] = bins[pick];
        bins[pick] = t;
      }
    });
    if (statistic() >= observed - tolerance) extreme++;
  }
  return {
    statistic: 'weighted mean |Δφ|',
    observedRad: observed,
    pValue: (1 + extreme) / (1 + options.permutations),
    permutations: options.permutations,
    rings: groups.length,
  };
}
