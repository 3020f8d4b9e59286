/**
 * Angular speeds, pattern speed, corotation and the gas-to-stars delay across an arm
 * (docs/methods.md, "Pattern speed and timescale"). Angular speeds in km/s/kpc, radii in kpc, times in Myr.
 */

import { angularSpeedKmsKpc } from './rotation-curves';
import type { RotationCurve } from './rotation-curves';

export { angularSpeedKmsKpc };

/** Kiloparsec in km: 1 pc = 648000/π au, au = 149 597 870.7 km exactly (IAU 2012 B2, IAU 2015 B2). */
export const KPC_KM = (648000 / Math.PI) * 149597870.7 * 1000;
/** Megayear in seconds (Julian year of 365.25 d). */
export const MYR_S = 1e6 * 365.25 * 86400;
/** 1 km/s/kpc expressed in Myr⁻¹ (≈ 1.0227e-3, i.e. 1.0227 Gyr⁻¹; 1/977.79 Myr⁻¹). */
export const KMS_KPC_PER_MYR = MYR_S / KPC_KM;

/**
 * Time (Myr) for material to drift azimuthOffsetDeg (deg, positive ahead in the sense of
 * rotation) relative to a spiral pattern rotating at patternSpeedKmsKpc, at radius RKpc:
 * t = Δβ / (Ω(R) − Ω_p), Ω = Θ/R. Positive when the drift is in the direction the material moves
 * relative to the pattern (ahead inside corotation, behind outside it); ±Infinity at corotation.
 */
export function delayMyr(
  azimuthOffsetDeg: number,
  RKpc: number,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
): number {
  const relative = angularSpeedKmsKpc(RKpc, curve) - patternSpeedKmsKpc;
  return (azimuthOffsetDeg * (Math.PI / 180)) / (relative * KMS_KPC_PER_MYR);
}

/** Orbital period (Myr) of circular rotation at RKpc on the curve: 2π / Ω. */
export function orbitalPeriodMyr(RKpc: number, curve: RotationCurve): number {
  return (2 * Math.PI) / (angularSpeedKmsKpc(RKpc, curve) * KMS_KPC_PER_MYR);
}

/**
 * Corotation radius (kpc) where Ω(R) = Θ/R equals the pattern speed (km/s/kpc), by bisection in
 * ln R over 0.01–1000 kpc (Θ/R falls with R for the supported curves); null if outside that range.
 */
export function corotationRadiusKpc(
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
): number | null {
  let lo = Math.log(0.01);
  let hi = Math.log(1000);
  const f = (lnR: number) => angularSpeedKmsKpc(Math.exp(lnR), curve) - patternSpeedKmsKpc;
  if (!(f(lo) > 0) || !(f(hi) < 0)) return null;
  for (let i = 0; i < 200 && hi - lo > 1e-14; i++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) > 0) lo = mid;
    else hi = mid;
  }
  return Math.exp(0.5 * (lo + hi));
}
