/**
 * The density-wave kinematics of the demo galaxy: angular speeds, corotation, the azimuthal
 * offset that a phase (time relative to the ridge crossing) implies, the streaming motion near a
 * ridge line and line-of-sight projection. Positions and velocities are in the Galactocentric
 * frame of `@/lib/astro/galactocentric` (kpc, km/s); azimuths in degrees.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import { ROTATION_SENSE, polarToXy, toGalactocentric } from '@/lib/astro/galactocentric';
import { corotationRadiusKpc, KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { angularSpeedKmsKpc, type RotationCurve } from '@/lib/astro/rotation-curves';
import { makeGalaxyCurve } from './curve';
import type { ModelParams } from './params';

const DEG = Math.PI / 180;

/** A ready-to-use model: the parameters with the rotation curve built and corotation solved. */
export type GalaxyModel = {
  params: ModelParams;
  curve: RotationCurve;
  R0Kpc: number;
  /** Corotation radius (kpc) where Θ(R)/R = Ω_p, or null when there is none. */
  corotationKpc: number | null;
};

/** Builds the generator's rotation curve from its constants and solves for corotation. */
export function makeGalaxyModel(params: ModelParams): GalaxyModel {
  const curve = makeGalaxyCurve(params.curve);
  return {
    params,
    curve,
    R0Kpc: curve.R0Kpc,
    corotationKpc: corotationRadiusKpc(curve, params.patternSpeedKmsKpc),
  };
}

/**
 * Azimuthal offset (deg, positive = ahead in the sense of rotation) reached after a time
 * phaseMyr (Myr, relative to the ridge crossing) by material circulating at radius RKpc through
 * a pattern of speed Ω_p: Δβ = (Ω(R) − Ω_p)·t, the inverse of `delayMyr` in
 * `@/lib/astro/pattern-speed` (Δφ = (Ω − Ω_p)·t as in Egusa et al. 2004, PASJ 56, L45).
 */
export function azimuthOffsetForPhaseDeg(
  model: GalaxyModel,
  RKpc: number,
  phaseMyr: number,
): number {
  const dOmega = angularSpeedKmsKpc(RKpc, model.curve) - model.params.patternSpeedKmsKpc;
  return (dOmega * phaseMyr * KMS_KPC_PER_MYR) / DEG;
}

/**
 * +1 where material overtakes the pattern (inside corotation, Ω > Ω_p), −1 outside: the sign of
 * "downstream" in azimuth at radius RKpc.
 */
export function flowSign(model: GalaxyModel, RKpc: number): 1 | -1 {
  return angularSpeedKmsKpc(RKpc, model.curve) >= model.params.patternSpeedKmsKpc ? 1 : -1;
}

/** In-plane unit vectors at azimuth β (deg): radial outward, and ahead in the sense of rotation. */
export function localAxes(betaDeg: number): { rx: number; ry: number; ax: number; ay: number } {
  const r = polarToXy(1, betaDeg);
  const t = polarToXy(1, betaDeg + 90);
  return { rx: r.xKpc, ry: r.yKpc, ax: ROTATION_SENSE * t.xKpc, ay: ROTATION_SENSE * t.yKpc };
}

/**
 * In-plane streaming velocity (km/s) at a point of azimuth β (deg) and radius R (kpc) lying
 * perpOffsetKpc from the ridge of `arm`: material crossing the arm is slowed across the ridge,
 * δv = −s V exp(−½ (d⊥/w)²) n̂, where n̂ = cos ψ ê_R + sin ψ ê_ahead is the ridge normal on the
 * downstream side of a trailing log spiral of pitch ψ and s = +1 inside corotation, −1 outside.
 * Inside corotation this gives inflow and a lag behind rotation on the arm, as in the shocked
 * density-wave flow of Roberts (1969). A simplified profile, documented in the truth file.
 */
export function streamingVelocityKms(
  model: GalaxyModel,
  arm: ArmSpec,
  RKpc: number,
  betaDeg: number,
  perpOffsetKpc: number,
): { vxKms: number; vyKms: number } {
  const { streamingKms, streamingWidthKpc } = model.params;
  const u = perpOffsetKpc / streamingWidthKpc;
  const amp = -flowSign(model, RKpc) * streamingKms * Math.exp(-0.5 * u * u);
  const psi = arm.pitchDeg * DEG;
  const { rx, ry, ax, ay } = localAxes(betaDeg);
  const nx = Math.cos(psi) * rx + Math.sin(psi) * ax;
  const ny = Math.cos(psi) * ry + Math.sin(psi) * ay;
  return { vxKms: amp * nx, vyKms: amp * ny };
}

/**
 * Unit vector (Galactocentric x, y, z) from the Sun toward Galactic (l, b) in degrees, taken
 * from the frame module itself so that it shares its convention.
 */
export function lineOfSight(
  lDeg: number,
  bDeg: number,
  R0Kpc: number,
): { ux: number; uy: number; uz: number } {
  const p = toGalactocentric(lDeg, bDeg, 1, R0Kpc);
  return { ux: p.xKpc - R0Kpc, uy: p.yKpc, uz: p.zKpc };
}
