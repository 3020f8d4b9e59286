/**
 * Places complexes and their members in the Galactocentric frame of `@/lib/astro/galactocentric`
 * and measures them against the arm ridges of `@/lib/astro/arms`: nearest arm, signed
 * perpendicular offset (kpc) and azimuthal offset at the same R (deg), both positive ahead of the
 * ridge in the sense of Galactic rotation, and the ridge normal at each complex.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import { ridgeOffsetsBulk } from './ridge-offset';
import { toGalactocentric } from '@/lib/astro/galactocentric';

/** Half step (kpc) of the central differences that give the ridge normal. */
const NORMAL_STEP_KPC = 0.005;

/** Complex positions and arm offsets; NaN (armIndex −1) where a complex has no distance. */
export type ComplexPlacement = {
  xKpc: Float64Array;
  yKpc: Float64Array;
  RKpc: Float64Array;
  betaDeg: Float64Array;
  armIndex: Int32Array;
  perpOffsetKpc: Float64Array;
  azimuthOffsetDeg: Float64Array;
  /** 1 when the nearest ridge point lies inside the arm's β range (not at one of its ends). */
  withinRange: Uint8Array;
  /** Unit normal of the nearest ridge (x, y), pointing ahead in the sense of rotation. */
  normalX: Float64Array;
  normalY: Float64Array;
};

/**
 * Galactocentric positions (kpc; β in deg) of points at Galactic (l, b) (deg) and line-of-sight
 * distance distKpc, with the Sun at R0Kpc on +x. NaN distances give NaN positions.
 */
export function placePoints(
  lDeg: Float64Array,
  bDeg: Float64Array,
  distKpc: Float64Array,
  R0Kpc: number,
): { xKpc: Float64Array; yKpc: Float64Array; RKpc: Float64Array; betaDeg: Float64Array } {
  const n = lDeg.length;
  const xKpc = new Float64Array(n);
  const yKpc = new Float64Array(n);
  const RKpc = new Float64Array(n);
  const betaDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = toGalactocentric(lDeg[i], bDeg[i], distKpc[i], R0Kpc);
    xKpc[i] = p.xKpc;
    yKpc[i] = p.yKpc;
    RKpc[i] = p.RKpc;
    betaDeg[i] = p.betaDeg;
  }
  return { xKpc, yKpc, RKpc, betaDeg };
}

function placedIndices(xKpc: Float64Array): Int32Array {
  const idx: number[] = [];
  for (let i = 0; i < xKpc.length; i++) if (xKpc[i] === xKpc[i]) idx.push(i);
  return Int32Array.from(idx);
}

function gather(src: Float64Array, idx: Int32Array, shift = 0): Float64Array {
  const out = new Float64Array(idx.length);
  for (let k = 0; k < idx.length; k++) out[k] = src[idx[k]] + shift;
  return out;
}

/**
 * Offsets of points (kpc, in-plane) from one given arm each (armOf[i] indexes `arms`; points with
 * armOf −1 or NaN positions are skipped and left NaN): signed perpendicular (kpc) and azimuthal
 * (deg) offsets, positive ahead. Points are grouped by arm so each arm is prepared once.
 */
export function offsetsFromAssignedArms(
  xKpc: Float64Array,
  yKpc: Float64Array,
  armOf: Int32Array,
  arms: ArmSpec[],
): { perpOffsetKpc: Float64Array; azimuthOffsetDeg: Float64Array } {
  const n = xKpc.length;
  const perpOffsetKpc = new Float64Array(n).fill(NaN);
  const azimuthOffsetDeg = new Float64Array(n).fill(NaN);
  arms.forEach((arm, a) => {
    const idx: number[] = [];
    for (let i = 0; i < n; i++) if (armOf[i] === a && xKpc[i] === xKpc[i]) idx.push(i);
    if (idx.length === 0) return;
    const sel = Int32Array.from(idx);
    const r = ridgeOffsetsBulk(gather(xKpc, sel), gather(yKpc, sel), [arm]);
    for (let k = 0; k < sel.length; k++) {
      perpOffsetKpc[sel[k]] = r.perpOffsetKpc[k];
      azimuthOffsetDeg[sel[k]] = r.azimuthOffsetDeg[k];
    }
  });
  return { perpOffsetKpc, azimuthOffsetDeg };
}

/**
 * Unit normals (x, y) of the assigned arm's ridge at each point, pointing ahead: the gradient of
 * the signed perpendicular offset by central differences (±5 pc), which equals the ridge normal
 * at the nearest ridge point (the offset is a signed distance). NaN where a point is skipped.
 */
export function ridgeNormals(
  xKpc: Float64Array,
  yKpc: Float64Array,
  armOf: Int32Array,
  arms: ArmSpec[],
): { normalX: Float64Array; normalY: Float64Array } {
  const n = xKpc.length;
  const h = NORMAL_STEP_KPC;
  const all = new Int32Array(n).map((_, i) => i);
  const at = (dx: number, dy: number) =>
    offsetsFromAssignedArms(gather(xKpc, all, dx), gather(yKpc, all, dy), armOf, arms)
      .perpOffsetKpc;
  const xp = at(h, 0);
  const xm = at(-h, 0);
  const yp = at(0, h);
  const ym = at(0, -h);
  const normalX = new Float64Array(n);
  const normalY = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const gx = xp[i] - xm[i];
    const gy = yp[i] - ym[i];
    const len = Math.hypot(gx, gy);
    normalX[i] = len > 0 ? gx / len : NaN;
    normalY[i] = len > 0 ? gy / len : NaN;
  }
  return { normalX, normalY };
}

/**
 * Places complexes at their distances (NaN = not placed) and finds each one's nearest arm among
 * `arms` with its offsets, range flag and ridge normal (see {@link ComplexPlacement}).
 */
export function placeComplexes(
  lDeg: Float64Array,
  bDeg: Float64Array,
  distKpc: Float64Array,
  arms: ArmSpec[],
  R0Kpc: number,
): ComplexPlacement {
  const n = lDeg.length;
  const pos = placePoints(lDeg, bDeg, distKpc, R0Kpc);
  const armIndex = new Int32Array(n).fill(-1);
  const perpOffsetKpc = new Float64Array(n).fill(NaN);
  const azimuthOffsetDeg = new Float64Array(n).fill(NaN);
  const withinRange = new Uint8Array(n);
  const idx = placedIndices(pos.xKpc);
  if (idx.length > 0) {
    const r = ridgeOffsetsBulk(gather(pos.xKpc, idx), gather(pos.yKpc, idx), arms);
    for (let k = 0; k < idx.length; k++) {
      const i = idx[k];
      armIndex[i] = r.armIndex[k];
      perpOffsetKpc[i] = r.perpOffsetKpc[k];
      azimuthOffsetDeg[i] = r.azimuthOffsetDeg[k];
      withinRange[i] = r.withinRange[k];
    }
  }
  const normals = ridgeNormals(pos.xKpc, pos.yKpc, armIndex, arms);
  return { ...pos, armIndex, perpOffsetKpc, azimuthOffsetDeg, withinRange, ...normals };
}
