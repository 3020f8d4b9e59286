/**
 * Where lines of sight from the Sun graze a spiral arm's ridge: the arm tangents of the
 * log-spiral arms of `./arms`, in the Galactocentric frame of `./galactocentric`. Angles in
 * degrees, lengths in kpc. A ridge may be shifted along its normal (positive ahead in the sense
 * of Galactic rotation), which is how a tracer class lying beside the ridge is described.
 */

import { wrap180Deg } from './angles';
import { ROTATION_SENSE, fromGalactocentric, polarToXy } from './galactocentric';
import { armRadiusKpc, type ArmSpec } from './arms';

const DEG = Math.PI / 180;
/** β step (deg) of the scan that brackets the extrema of l before they are refined. */
const SCAN_STEP_DEG = 0.05;

/** A ridge point with the unit normal that points ahead of the ridge in the sense of rotation. */
export type RidgeFrame = {
  xKpc: number;
  yKpc: number;
  RKpc: number;
  /** Pitch angle (deg) of the ridge at this point (the segment's pitch for a kinked arm). */
  pitchDeg: number;
  aheadX: number;
  aheadY: number;
};

/** One tangent of a ridge seen from the Sun. */
export type ArmTangent = {
  /** Galactic longitude of the tangent (deg, [0, 360)). */
  lDeg: number;
  /** Ridge azimuth β (deg) of the tangent point (the unshifted ridge's parameter). */
  betaDeg: number;
  /** Galactocentric radius (kpc) of the tangent point. */
  RKpc: number;
  /** In-plane distance (kpc) from the Sun to the tangent point. */
  distKpc: number;
  pitchDeg: number;
};

function localPitchDeg(arm: ArmSpec, betaDeg: number): number {
  if (arm.betaKinkDeg === undefined || betaDeg <= arm.betaKinkDeg) return arm.pitchDeg;
  return arm.pitchAfterKinkDeg ?? arm.pitchDeg;
}

/**
 * The ridge point of `arm` at azimuth betaDeg and the unit normal pointing ahead of it. For a log
 * spiral the tangent is −sin ψ e_R + cos ψ e_β (dR/dβ = −R tan ψ), so the normal is
 * ±(cos ψ e_R + sin ψ e_β), the sign chosen so that its β component points in the sense of
 * rotation — the convention of `offsetFromArms` in `./arms`.
 */
export function ridgeFrame(arm: ArmSpec, betaDeg: number): RidgeFrame {
  const RKpc = armRadiusKpc(arm, betaDeg);
  const pitchDeg = localPitchDeg(arm, betaDeg);
  const { xKpc, yKpc } = polarToXy(RKpc, betaDeg);
  const b = betaDeg * DEG;
  const p = pitchDeg * DEG;
  const s = (p < 0 ? -1 : 1) * ROTATION_SENSE;
  // e_R = (cos β, −sin β), e_β = (−sin β, −cos β) in this frame.
  const aheadX = s * (Math.cos(p) * Math.cos(b) - Math.sin(p) * Math.sin(b));
  const aheadY = s * (-Math.cos(p) * Math.sin(b) - Math.sin(p) * Math.cos(b));
  return { xKpc, yKpc, RKpc, pitchDeg, aheadX, aheadY };
}

/** In-plane position (kpc) of the ridge point at betaDeg moved normalOffsetKpc along its ahead normal. */
export function shiftedRidgePoint(
  arm: ArmSpec,
  betaDeg: number,
  normalOffsetKpc: number,
): { xKpc: number; yKpc: number } {
  const f = ridgeFrame(arm, betaDeg);
  return {
    xKpc: f.xKpc + normalOffsetKpc * f.aheadX,
    yKpc: f.yKpc + normalOffsetKpc * f.aheadY,
  };
}

/** Golden-section search for the maximum of f on [lo, hi] (f unimodal there). */
function goldenMax(f: (x: number) => number, lo: number, hi: number): number {
  const phi = (Math.sqrt(5) - 1) / 2;
  let a = hi - phi * (hi - lo);
  let b = lo + phi * (hi - lo);
  let fa = f(a);
  let fb = f(b);
  for (let k = 0; k < 100 && hi - lo > 1e-10; k++) {
    if (fa >= fb) {
      hi = b;
      b = a;
      fb = fa;
      a = hi - phi * (hi - lo);
      fa = f(a);
    } else {
      lo = a;
      a = b;
      fa = fb;
      b = lo + phi * (hi - lo);
      fb = f(b);
    }
  }
  return 0.5 * (lo + hi);
}

/**
 * Every inner-Galaxy tangent of the arm's ridge (optionally shifted by normalOffsetKpc along its
 * ahead normal) seen from the Sun at (R0Kpc, 0): the local extrema of Galactic longitude along the
 * ridge within the arm's β range — a maximum of l for 0° < l < 90°, a minimum for
 * 270° < l < 360°. Extrema are bracketed by a scan every 0.05° of β and refined by golden-section
 * search on l itself; the ends of the β range are not tangents. On a kinked arm the unshifted ridge
 * may touch a sight line at its corner, which counts; a shifted copy has a gap at the kink (the two
 * segments' normals differ), which does not. Sorted by β.
 */
export function armTangentLongitudes(
  arm: ArmSpec,
  R0Kpc: number,
  normalOffsetKpc = 0,
): ArmTangent[] {
  if (!(R0Kpc > 0)) throw new RangeError(`armTangentLongitudes: R0Kpc = ${R0Kpc} must be positive`);
  if (!Number.isFinite(normalOffsetKpc))
    throw new RangeError(
      `armTangentLongitudes: normalOffsetKpc = ${normalOffsetKpc} is not finite`,
    );
  const lonAt = (betaDeg: number): number => {
    const p = shiftedRidgePoint(arm, betaDeg, normalOffsetKpc);
    return fromGalactocentric(p.xKpc, p.yKpc, 0, R0Kpc).lDeg;
  };
  const span = arm.betaMaxDeg - arm.betaMinDeg;
  const n = Math.max(3, Math.ceil(span / SCAN_STEP_DEG) + 1);
  const step = span / (n - 1);
  const beta = Float64Array.from({ length: n }, (_, i) => arm.betaMinDeg + i * step);
  // Longitude unwrapped along the ridge so that extrema near l = 0°/360° are seen.
  const l = new Float64Array(n);
  l[0] = lonAt(beta[0]);
  for (let i = 1; i < n; i++) l[i] = l[i - 1] + wrap180Deg(lonAt(beta[i]) - l[i - 1]);

  const tangents: ArmTangent[] = [];
  for (let i = 1; i < n - 1; i++) {
    const isMax = l[i] >= l[i - 1] && l[i] > l[i + 1];
    const isMin = l[i] <= l[i - 1] && l[i] < l[i + 1];
    if (!isMax && !isMin) continue;
    const sign = isMax ? 1 : -1;
    const ref = l[i];
    const betaT = goldenMax(
      (b) => sign * (ref + wrap180Deg(lonAt(b) - ref)),
      beta[i - 1],
      beta[i + 1],
    );
    const atKink = arm.betaKinkDeg !== undefined && Math.abs(betaT - arm.betaKinkDeg) < 1e-6;
    if (atKink && normalOffsetKpc !== 0) continue;
    const p = shiftedRidgePoint(arm, betaT, normalOffsetKpc);
    const h = fromGalactocentric(p.xKpc, p.yKpc, 0, R0Kpc);
    const inner = isMax ? h.lDeg > 0 && h.lDeg < 90 : h.lDeg > 270 && h.lDeg < 360;
    if (!inner) continue;
    tangents.push({
      lDeg: h.lDeg,
      betaDeg: betaT,
      RKpc: Math.hypot(p.xKpc, p.yKpc),
      distKpc: h.distKpc,
      pitchDeg: localPitchDeg(arm, betaT),
    });
  }
  return tangents;
}

/**
 * Normal offset (kpc, positive ahead in the sense of rotation) of the copy of the ridge, shifted
 * along its normal, whose tangent lies at longitude lDeg near the ridge's own `tangent`. A copy
 * shifted along the normal keeps the ridge's tangent direction at each β, and the tangent
 * direction of a log spiral turns by −1° per degree of β in this frame, so the copy touches the
 * sight line at l at β* = β_t − (l − l_t); its offset is the distance from that ridge point to
 * the sight line, measured along the ahead normal. Exact for a log-spiral segment; across a kink
 * it uses the pitch of the segment that β* falls in.
 */
export function tangentNormalOffsetKpc(
  arm: ArmSpec,
  R0Kpc: number,
  tangent: ArmTangent,
  lDeg: number,
): number {
  const betaStar = tangent.betaDeg - wrap180Deg(lDeg - tangent.lDeg);
  const f = ridgeFrame(arm, betaStar);
  return (R0Kpc - f.xKpc) * f.aheadX + (0 - f.yKpc) * f.aheadY;
}
