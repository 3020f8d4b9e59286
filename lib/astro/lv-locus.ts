/**
 * Where a line of sight meets a spiral-arm ridge, and how the model velocity changes across the
 * arm there. Frame of `./galactocentric` (Sun at (R0, 0), β increasing with l and with rotation);
 * arms as in `./arms`. The sight line at longitude l runs in the plane along
 * ŝ = (−cos l, −sin l); a source at latitude b whose in-plane projection lies on the ridge is at
 * line-of-sight distance d = d_plane / cos b.
 *
 * The across-arm direction is the ridge normal n̂ pointing AHEAD in the sense of rotation: for a
 * log spiral of local pitch ψ, n̂ = ±(cos ψ ê_R + sin ψ ê_β) with the sign that makes n̂·ê_β > 0
 * (ψ > 0: the outer side is ahead). A ring (ψ = 0) has no ahead side; its outward normal is used.
 */

import { armPoints, armRadiusKpc, type ArmSpec } from './arms';
import { polarToXy } from './galactocentric';
import { vLsrAtKms } from './kinematic-distance';
import type { RotationCurve } from './rotation-curves';

const DEG = Math.PI / 180;

/** An arm's ridge sampled for crossing searches, with the Sun–centre distance of the frame. */
export type ArmRidge = {
  arm: ArmSpec;
  R0Kpc: number;
  betaDeg: Float64Array;
  xKpc: Float64Array;
  yKpc: Float64Array;
};

/** Samples the ridge of `arm` every stepDeg of β (default 0.5°) for {@link sightLineCrossings}. */
export function armRidge(arm: ArmSpec, R0Kpc: number, stepDeg = 0.5): ArmRidge {
  if (!(R0Kpc > 0 && R0Kpc < Infinity))
    throw new RangeError(`R0Kpc = ${R0Kpc} must be a positive number`);
  const pts = armPoints(arm, stepDeg);
  return { arm, R0Kpc, betaDeg: pts.betaDeg, xKpc: pts.xKpc, yKpc: pts.yKpc };
}

/** Cross product (kpc) of (ridge point at betaDeg − Sun) with the in-plane sight direction (sx, sy). */
function crossWithSight(ridge: ArmRidge, sx: number, sy: number, betaDeg: number): number {
  const q = polarToXy(armRadiusKpc(ridge.arm, betaDeg), betaDeg);
  return (q.xKpc - ridge.R0Kpc) * sy - q.yKpc * sx;
}

/**
 * Every point where the sight line at Galactic longitude lDeg (in the plane, in front of the Sun)
 * crosses the ridge within the arm's β range: near and far sides and further windings alike.
 * Writes the crossings' β (deg) and in-plane distances from the Sun (kpc) into the two buffers
 * (each at least as long as the ridge sample) in order of β, and returns how many there are.
 * Each sign change of the cross product between neighbouring samples is refined by regula falsi
 * (Illinois variant) to 1e-10° in β; where the sight line comes within {@link GRAZE_KPC} of a
 * sample without a sign change (an arm tangent), a golden-section search looks for the pair of
 * crossings between the neighbouring samples.
 */
export function sightLineCrossings(
  ridge: ArmRidge,
  lDeg: number,
  outBetaDeg: Float64Array,
  outDPlaneKpc: Float64Array,
): number {
  const n = ridge.betaDeg.length;
  if (outBetaDeg.length < n || outDPlaneKpc.length < n)
    throw new RangeError(
      `crossing buffers (${outBetaDeg.length}, ${outDPlaneKpc.length}) are shorter than the ridge sample (${n})`,
    );
  const sx = -Math.cos(lDeg * DEG);
  const sy = -Math.sin(lDeg * DEG);
  const { betaDeg, xKpc, yKpc, R0Kpc } = ridge;
  const out = { betaDeg: outBetaDeg, dPlaneKpc: outDPlaneKpc, count: 0 };
  let fPrev = NaN;
  let fHere = (xKpc[0] - R0Kpc) * sy - yKpc[0] * sx;
  for (let i = 0; i < n; i++) {
    const fNext = i + 1 < n ? (xKpc[i + 1] - R0Kpc) * sy - yKpc[i + 1] * sx : NaN;
    if (fHere === 0) emit(ridge, sx, sy, betaDeg[i], out);
    else if (fHere * fNext < 0)
      emit(ridge, sx, sy, refine(ridge, sx, sy, betaDeg[i], fHere, betaDeg[i + 1], fNext), out);
    else if (
      Math.abs(fHere) < GRAZE_KPC &&
      fHere * fPrev > 0 &&
      fHere * fNext > 0 &&
      Math.abs(fHere) < Math.abs(fPrev) &&
      Math.abs(fHere) <= Math.abs(fNext)
    )
      grazing(ridge, sx, sy, betaDeg[i - 1], betaDeg[i + 1], Math.sign(fHere), out);
    fPrev = fHere;
    fHere = fNext;
  }
  return out.count;
}

type CrossingOut = { betaDeg: Float64Array; dPlaneKpc: Float64Array; count: number };

/** Appends the crossing at betaDeg if it lies in front of the Sun. */
function emit(ridge: ArmRidge, sx: number, sy: number, betaDeg: number, out: CrossingOut): void {
  const q = polarToXy(armRadiusKpc(ridge.arm, betaDeg), betaDeg);
  const along = (q.xKpc - ridge.R0Kpc) * sx + q.yKpc * sy;
  if (!(along > 0)) return;
  out.betaDeg[out.count] = betaDeg;
  out.dPlaneKpc[out.count] = along;
  out.count++;
}

/**
 * Distance (kpc) from the sight line below which a local minimum of it along the ridge samples
 * is searched for a pair of crossings between samples: far above the ~1e-4 kpc by which a ridge
 * sampled every 0.5° departs from its chords.
 */
const GRAZE_KPC = 1e-2;

/** A sight line that may graze the ridge between samples lo and hi: golden-section minimum of sign · cross, then both roots. */
function grazing(
  ridge: ArmRidge,
  sx: number,
  sy: number,
  lo: number,
  hi: number,
  sign: number,
  out: CrossingOut,
): void {
  const g = (beta: number) => sign * crossWithSight(ridge, sx, sy, beta);
  const phi = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  let c = b - phi * (b - a);
  let d = a + phi * (b - a);
  let gc = g(c);
  let gd = g(d);
  for (let k = 0; k < 80 && b - a > 1e-12 && gc > 0 && gd > 0; k++) {
    if (gc < gd) {
      b = d;
      d = c;
      gd = gc;
      c = b - phi * (b - a);
      gc = g(c);
    } else {
      a = c;
      c = d;
      gc = gd;
      d = a + phi * (b - a);
      gd = g(d);
    }
  }
  const mid = gc <= gd ? c : d;
  const gMid = Math.min(gc, gd);
  if (gMid > 0) return;
  if (gMid === 0) {
    emit(ridge, sx, sy, mid, out);
    return;
  }
  emit(ridge, sx, sy, refine(ridge, sx, sy, lo, sign * g(lo), mid, sign * gMid), out);
  emit(ridge, sx, sy, refine(ridge, sx, sy, mid, sign * gMid, hi, sign * g(hi)), out);
}

function refine(
  ridge: ArmRidge,
  sx: number,
  sy: number,
  a0: number,
  fa0: number,
  b0: number,
  fb0: number,
): number {
  let a = a0;
  let b = b0;
  let fa = fa0;
  let fb = fb0;
  for (let k = 0; k < 60 && Math.abs(b - a) > 1e-10; k++) {
    const c = (a * fb - b * fa) / (fb - fa);
    const fc = crossWithSight(ridge, sx, sy, c);
    if (fc === 0) return c;
    if (fc * fb < 0) {
      a = b;
      fa = fb;
    } else {
      // Illinois step: the end kept twice has its weight halved, so it cannot stall.
      fa /= 2;
    }
    b = c;
    fb = fc;
  }
  return b;
}

/** Local pitch angle (deg) of the arm at azimuth betaDeg: pitchDeg up to β_kink, pitchAfterKinkDeg beyond (see ArmSpec). */
export function localPitchDeg(arm: ArmSpec, betaDeg: number): number {
  if (arm.betaKinkDeg !== undefined && betaDeg > arm.betaKinkDeg)
    return arm.pitchAfterKinkDeg ?? arm.pitchDeg;
  return arm.pitchDeg;
}

/**
 * ŝ·n̂ at the ridge point of azimuth betaDeg: the in-plane sight-line direction at longitude lDeg
 * dotted with the ridge normal that points ahead in the sense of rotation (module comment). Its
 * magnitude is the sine of the angle at which the sight line crosses the ridge.
 */
export function sightDotAheadNormal(arm: ArmSpec, betaDeg: number, lDeg: number): number {
  const psi = localPitchDeg(arm, betaDeg) * DEG;
  const sign = psi < 0 ? -1 : 1;
  const beta = betaDeg * DEG;
  // ê_R = (cos β, −sin β), ê_β = (−sin β, −cos β) in this frame.
  const nx = sign * (Math.cos(psi) * Math.cos(beta) - Math.sin(psi) * Math.sin(beta));
  const ny = sign * (-Math.cos(psi) * Math.sin(beta) - Math.sin(psi) * Math.cos(beta));
  return -Math.cos(lDeg * DEG) * nx - Math.sin(lDeg * DEG) * ny;
}

/** Step (kpc of in-plane distance) of the central difference in {@link dvDdPlaneKmsPerKpc}. */
const GRADIENT_STEP_KPC = 1e-4;

/**
 * dv_LSR/d(d_plane) (km/s per kpc): how the circular-rotation LSR velocity on `curve` changes as
 * one moves along the sight line (l, b in deg) at in-plane distance dPlaneKpc from the Sun.
 * Central difference of {@link vLsrAtKms} over ±0.1 pc (one-sided next to the Sun).
 */
export function dvDdPlaneKmsPerKpc(
  lDeg: number,
  bDeg: number,
  dPlaneKpc: number,
  curve: RotationCurve,
): number {
  const cb = Math.cos(bDeg * DEG);
  const lo = Math.max(0, dPlaneKpc - GRADIENT_STEP_KPC);
  const hi = dPlaneKpc + GRADIENT_STEP_KPC;
  return (
    (vLsrAtKms(lDeg, bDeg, hi / cb, curve) - vLsrAtKms(lDeg, bDeg, lo / cb, curve)) / (hi - lo)
  );
}
