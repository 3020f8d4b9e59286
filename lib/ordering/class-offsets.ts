/**
 * Offsets of the tracer classes from the arm ridges, measured in the sense of rotation (positive
 * ahead), with intervals that carry each complex's distance distribution (docs/methods.md,
 * "Class offsets"). A member takes its complex's offset in every draw: members of one complex lie
 * within the link radius of each other, a few pc at most, far below the distance errors. The
 * young-minus-gas offset is the difference of the two medians within each resample, so its
 * interval is that of the difference itself.
 */
import { isGasKind, isYoungKind, TRACER_KINDS, type MemberColumns } from './members';
import { percentileCi, pooledMedian, type DrawMatrices, type Group } from './nested-bootstrap';
import type { ClassSummary, YoungMinusGas } from './types';

/** Matrix index of each quantity in the analysis's {@link DrawMatrices}. */
export const MATRIX = { perp: 0, azimuth: 1 } as const;

/** Members of each kind, gas and young, per complex. */
export type MemberCounts = { perKind: Int32Array[]; gas: Int32Array; young: Int32Array };

/** Counts members per complex and class (complex c's members are rows start[c] … start[c+1]−1). */
export function memberCounts(cols: MemberColumns, nComplexes: number): MemberCounts {
  const perKind = TRACER_KINDS.map(() => new Int32Array(nComplexes));
  const gas = new Int32Array(nComplexes);
  const young = new Int32Array(nComplexes);
  for (let c = 0; c < nComplexes; c++)
    for (let i = cols.start[c]; i < cols.start[c + 1]; i++) {
      const k = cols.kind[i];
      perKind[k][c]++;
      if (isGasKind(k)) gas[c]++;
      if (isYoungKind(k)) young[c]++;
    }
  return { perKind, gas, young };
}

/** The group of complexes in `keep` with members counted in `counts`, on one matrix. */
export function groupOf(counts: Int32Array, keep: Int32Array, matrix: number): Group {
  const complexes: number[] = [];
  const weights: number[] = [];
  for (const c of keep)
    if (counts[c] > 0) {
      complexes.push(c);
      weights.push(counts[c]);
    }
  return { complexes: Int32Array.from(complexes), weights: Float64Array.from(weights), matrix };
}

function members(g: Group): number {
  return g.weights.reduce((s, w) => s + w, 0);
}

function nullable(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/** Plans the groups of one set of complexes: every kind (perp, azimuth), gas and young (both). */
export type ClassPlan = {
  kinds: number[];
  perp: Group[];
  azimuth: Group[];
  gasPerp: Group;
  youngPerp: Group;
  gasAzimuth: Group;
  youngAzimuth: Group;
};

/** Groups for the classes of the complexes in `keep`. */
export function classPlan(counts: MemberCounts, keep: Int32Array): ClassPlan {
  const kinds = TRACER_KINDS.map((_, k) => k).filter((k) =>
    keep.some((c) => counts.perKind[k][c] > 0),
  );
  return {
    kinds,
    perp: kinds.map((k) => groupOf(counts.perKind[k], keep, MATRIX.perp)),
    azimuth: kinds.map((k) => groupOf(counts.perKind[k], keep, MATRIX.azimuth)),
    gasPerp: groupOf(counts.gas, keep, MATRIX.perp),
    youngPerp: groupOf(counts.young, keep, MATRIX.perp),
    gasAzimuth: groupOf(counts.gas, keep, MATRIX.azimuth),
    youngAzimuth: groupOf(counts.young, keep, MATRIX.azimuth),
  };
}

/** Every group of a plan, in a fixed order (the order {@link summarisePlan} reads replicates). */
export function planGroups(p: ClassPlan): Group[] {
  return [...p.perp, ...p.azimuth, p.gasPerp, p.youngPerp, p.gasAzimuth, p.youngAzimuth];
}

function difference(a: Float64Array, b: Float64Array): Float64Array {
  return Float64Array.from(a, (x, r) => x - b[r]);
}

/** Summaries of a plan from its groups' replicates (in {@link planGroups} order). */
export function summarisePlan(
  m: DrawMatrices,
  p: ClassPlan,
  reps: Float64Array[],
): { classes: ClassSummary[]; youngMinusGas: YoungMinusGas } {
  const nk = p.kinds.length;
  const classes = p.kinds.map((k, i) => {
    const g = p.perp[i];
    const empty = g.complexes.length === 0;
    return {
      kind: TRACER_KINDS[k],
      n: members(g),
      nComplexes: g.complexes.length,
      medianOffsetKpc: empty ? null : nullable(pooledMedian(m, g)),
      ci95: empty ? null : percentileCi(reps[i]),
      medianAzimuthOffsetDeg: empty ? null : nullable(pooledMedian(m, p.azimuth[i])),
      azimuthCi95: empty ? null : percentileCi(reps[nk + i]),
    };
  });
  const [gp, yp, ga, ya] = reps.slice(2 * nk);
  const both = p.gasPerp.complexes.length > 0 && p.youngPerp.complexes.length > 0;
  const youngMinusGas: YoungMinusGas = {
    nGas: members(p.gasPerp),
    nYoung: members(p.youngPerp),
    medianOffsetKpc: both
      ? nullable(pooledMedian(m, p.youngPerp) - pooledMedian(m, p.gasPerp))
      : null,
    ci95: both ? percentileCi(difference(yp, gp)) : null,
    azimuthDeg: both
      ? nullable(pooledMedian(m, p.youngAzimuth) - pooledMedian(m, p.gasAzimuth))
      : null,
    azimuthCi95: both ? percentileCi(difference(ya, ga)) : null,
  };
  return { classes, youngMinusGas };
}
