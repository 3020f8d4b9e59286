/**
 * Where every distance draw puts a complex against the arms: Galactocentric position (with the
 * draw's own R0), nearest arm, signed perpendicular offset from its ridge and azimuthal offset at
 * the same R, both positive ahead in the sense of rotation. A complex's arm is the arm most of
 * its draws fall nearest to; a draw counts ("on its arm") when it falls nearest to that arm,
 * within the arm's β range and within the arm width — other draws are left out of the offsets,
 * and a complex with fewer than half of its draws on its arm is left out as off-arm.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import { toGalactocentric } from '@/lib/astro/galactocentric';
import { quantileSelectInPlace } from '@/lib/stats/summary';
import type { DistanceDraws } from './distance-draws';
import { prepareRidges, ridgeOffset, type RidgeOffset } from './ridge-offset';

/** Offsets of n complexes × D draws ([c·D + j]; NaN where the draw is not on the complex's arm). */
export type DrawOffsets = {
  perpKpc: Float64Array;
  azimuthDeg: Float64Array;
  /** Galactocentric radius of each draw (kpc; NaN where the draw has no distance). */
  RKpc: Float64Array;
  /** Arm of each complex (index into the arms; −1 where no draw has a distance). */
  arm: Int32Array;
  /** Share of a complex's draws on its arm. */
  onArmShare: Float64Array;
};

/** Places every draw (see the module comment). */
export function offsetsOfDraws(
  lDeg: Float64Array,
  bDeg: Float64Array,
  draws: DistanceDraws,
  arms: ArmSpec[],
  armWidthKpc: number,
): DrawOffsets {
  const { count: n, draws: D } = draws;
  const prepared = prepareRidges(arms);
  const perpKpc = new Float64Array(n * D).fill(NaN);
  const azimuthDeg = new Float64Array(n * D).fill(NaN);
  const RKpc = new Float64Array(n * D).fill(NaN);
  const armOf = new Int16Array(n * D).fill(-1);
  const arm = new Int32Array(n).fill(-1);
  const onArmShare = new Float64Array(n);
  const votes = new Int32Array(arms.length);
  const out: RidgeOffset = {
    armIndex: -1,
    perpOffsetKpc: NaN,
    azimuthOffsetDeg: NaN,
    withinRange: false,
  };
  for (let c = 0; c < n; c++) {
    votes.fill(0);
    for (let j = 0; j < D; j++) {
      const k = c * D + j;
      const d = draws.distKpc[k];
      if (!(d === d)) continue;
      const p = toGalactocentric(lDeg[c], bDeg[c], d, draws.R0Kpc[j]);
      RKpc[k] = p.RKpc;
      ridgeOffset(prepared, p.xKpc, p.yKpc, out);
      if (out.armIndex < 0) continue;
      votes[out.armIndex]++;
      if (!out.withinRange || !(Math.abs(out.perpOffsetKpc) <= armWidthKpc)) continue;
      armOf[k] = out.armIndex;
      perpKpc[k] = out.perpOffsetKpc;
      azimuthDeg[k] = out.azimuthOffsetDeg;
    }
    let best = -1;
    for (let a = 0; a < arms.length; a++)
      if (votes[a] > 0 && (best < 0 || votes[a] > votes[best])) best = a;
    arm[c] = best;
    let on = 0;
    for (let j = 0; j < D; j++) {
      const k = c * D + j;
      if (armOf[k] === best && best >= 0) on++;
      else {
        perpKpc[k] = NaN;
        azimuthDeg[k] = NaN;
      }
    }
    onArmShare[c] = on / D;
  }
  return { perpKpc, azimuthDeg, RKpc, arm, onArmShare };
}

/** Quantiles (type 7) of complex c's draws in a [c·D + j] matrix, NaN-free draws only; NaN when none. */
export function drawQuantiles(
  matrix: Float64Array,
  c: number,
  D: number,
  levels: readonly number[],
  scratch: Float64Array,
): number[] {
  let m = 0;
  for (let j = 0; j < D; j++) {
    const v = matrix[c * D + j];
    if (v === v) scratch[m++] = v;
  }
  if (m === 0) return levels.map(() => NaN);
  const view = scratch.subarray(0, m);
  return levels.map((p) => quantileSelectInPlace(view, p));
}
