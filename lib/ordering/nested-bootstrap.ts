/**
 * Nested bootstrap over complexes and their distance draws (docs/methods.md, "Intervals"):
 * each resample draws the used complexes with replacement (the cluster bootstrap, Davison &
 * Hinkley 1997, §3.8: members of one complex share its distance, so the complex is the unit) and
 * gives every drawn complex one of its distance draws. The draw index is shared by all complexes
 * of a resample, so the draws' common Galactic constants stay one systematic error; a complex
 * whose shared draw is not usable takes one of its usable draws at random. Every statistic of a
 * resample (all classes, arms and radial bins) sees the same complexes and the same draws, so
 * differences between statistics and fits across bins get joint intervals.
 *
 * A statistic is the weighted median of one value matrix over a group of complexes, each
 * weighted by its number of members in the group; its point estimate is the weighted median of
 * the pooled draws (each complex's usable draws sharing its weight).
 */
import { makeRng } from '@/lib/stats/rng';
import { weightedMedianInPlace } from '@/lib/stats/weighted-median';
import { CI_LEVEL } from './cluster-bootstrap';
import { percentileInterval } from './pattern-fit';
import type { Ci } from './types';

/** Complexes of a statistic with their weights (members), and which value matrix it reads. */
export type Group = { complexes: Int32Array; weights: Float64Array; matrix: number };

/** Value matrices n × D ([c·D + j]; NaN = unusable draw, the same pattern in every matrix). */
export type DrawMatrices = { count: number; draws: number; values: Float64Array[] };

function usableDraws(m: DrawMatrices): { start: Int32Array; index: Int32Array } {
  const { count: n, draws: D } = m;
  const v = m.values[0];
  const start = new Int32Array(n + 1);
  const list: number[] = [];
  for (let c = 0; c < n; c++) {
    start[c] = list.length;
    for (let j = 0; j < D; j++) if (v[c * D + j] === v[c * D + j]) list.push(j);
  }
  start[n] = list.length;
  return { start, index: Int32Array.from(list) };
}

/** Pooled point estimate of a group: weighted median over every usable draw. NaN when empty. */
export function pooledMedian(m: DrawMatrices, g: Group): number {
  const { draws: D } = m;
  const v = m.values[g.matrix];
  let size = 0;
  for (const c of g.complexes)
    for (let j = 0; j < D; j++) if (v[c * D + j] === v[c * D + j]) size++;
  const vals = new Float64Array(size);
  const wts = new Float64Array(size);
  let k = 0;
  g.complexes.forEach((c, i) => {
    let usable = 0;
    for (let j = 0; j < D; j++) if (v[c * D + j] === v[c * D + j]) usable++;
    for (let j = 0; j < D; j++) {
      const x = v[c * D + j];
      if (!(x === x)) continue;
      vals[k] = x;
      wts[k++] = g.weights[i] / usable;
    }
  });
  return weightedMedianInPlace(vals, wts, size);
}

/**
 * Replicates of every group's weighted median over `resamples` nested resamples of the
 * `universe` of complexes (see the module comment); NaN where a resample holds none of a group's
 * complexes. Seeded, reproducible.
 */
export function nestedReplicates(
  m: DrawMatrices,
  universe: Int32Array,
  groups: Group[],
  resamples: number,
  seed: number,
): Float64Array[] {
  const { count: n, draws: D } = m;
  const usable = usableDraws(m);
  const rng = makeRng(seed);
  const mult = new Int32Array(n);
  // Per resample, each drawn complex's value in every matrix, gathered once: groups then read
  // these dense columns instead of the n × D matrices.
  const picked = m.values.map(() => new Float64Array(n));
  const out = groups.map(() => new Float64Array(resamples));
  const largest = groups.reduce((s, g) => Math.max(s, g.complexes.length), 0);
  const vals = new Float64Array(largest);
  const wts = new Float64Array(largest);
  const u = universe.length;
  const first = m.values[0];
  for (let r = 0; r < resamples; r++) {
    for (let k = 0; k < u; k++) mult[universe[rng.int(u)]]++;
    const j = rng.int(D);
    for (let k = 0; k < u; k++) {
      const c = universe[k];
      if (mult[c] === 0) continue;
      const own = first[c * D + j];
      const s = usable.start[c];
      const len = usable.start[c + 1] - s;
      const draw = own === own || len === 0 ? j : usable.index[s + rng.int(len)];
      for (let q = 0; q < picked.length; q++) picked[q][c] = m.values[q][c * D + draw];
    }
    for (let gi = 0; gi < groups.length; gi++) {
      const g = groups[gi];
      const v = picked[g.matrix];
      const cs = g.complexes;
      const ws = g.weights;
      let size = 0;
      for (let i = 0; i < cs.length; i++) {
        const c = cs[i];
        const w = mult[c];
        if (w === 0) continue;
        const x = v[c];
        if (!(x === x)) continue;
        vals[size] = x;
        wts[size++] = w * ws[i];
      }
      out[gi][r] = weightedMedianInPlace(vals, wts, size);
    }
    for (let k = 0; k < u; k++) mult[universe[k]] = 0;
  }
  return out;
}

/** Percentile interval at {@link CI_LEVEL} of the finite replicates; null when fewer than half are finite. */
export function percentileCi(replicates: Float64Array): Ci | null {
  const finite = replicates.filter((x) => Number.isFinite(x));
  if (finite.length === 0 || finite.length < replicates.length / 2) return null;
  return percentileInterval(finite, CI_LEVEL);
}
