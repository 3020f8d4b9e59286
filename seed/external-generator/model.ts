/**
 * The dynamics of the synthetic external spiral: a rising-then-flat rotation curve, an m-armed
 * log-spiral ridge rotating rigidly at Ω_p, circular orbits, and the most recent time an orbit
 * crossed a ridge, found by stepping back along the orbit and bisecting (not from a closed-form
 * offset). Radii in kpc, azimuths in rad growing in the sense of rotation, times in Myr (negative
 * in the past), speeds in km/s, angular speeds in km/s/kpc.
 */
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';

const TWO_PI = 2 * Math.PI;

/** Circular speed (km/s) of the arctangent model V = V_flat (2/π) arctan(R/R_t) (Courteau 1997, AJ 114, 2402). */
export function arctanCurveKms(RKpc: number, vFlatKms: number, turnoverKpc: number): number {
  return ((2 * vFlatKms) / Math.PI) * Math.atan(RKpc / turnoverKpc);
}

/** The pattern: m arms, pitch ψ (trailing for ψ > 0), ridge phase at RRefKpc at time 0, pattern speed. */
export type SpiralPattern = {
  m: number;
  pitchDeg: number;
  phaseDeg: number;
  RRefKpc: number;
  patternSpeedKmsKpc: number;
};

/** Azimuth (rad, unwrapped) of arm 0's ridge at radius RKpc as a function of time (Myr). */
export function ridgeAzimuthAt(pattern: SpiralPattern, RKpc: number): (tMyr: number) => number {
  const DEG = Math.PI / 180;
  const atZero =
    pattern.phaseDeg * DEG - Math.log(RKpc / pattern.RRefKpc) / Math.tan(pattern.pitchDeg * DEG);
  const speed = pattern.patternSpeedKmsKpc * KMS_KPC_PER_MYR;
  return (tMyr) => atZero + speed * tMyr;
}

/** A circular orbit: azimuth (rad, unwrapped) at time tMyr of a particle at phiNowRad at time 0. */
export function circularOrbit(omegaKmsKpc: number, phiNowRad: number): (tMyr: number) => number {
  return (tMyr) => phiNowRad + omegaKmsKpc * KMS_KPC_PER_MYR * tMyr;
}

/**
 * Age (Myr, the youngest in [minAgeMyr, maxAgeMyr]) of a crossing of the orbit with any of the m
 * ridges: steps of stepMyr back along m(φ_orbit − φ_ridge)/2π, which is continuous, until it
 * passes a whole number, then bisection to 1e-7 Myr. Null when no crossing lies in the range.
 */
export function crossingAgeMyr(
  orbit: (tMyr: number) => number,
  ridge: (tMyr: number) => number,
  m: number,
  minAgeMyr: number,
  maxAgeMyr: number,
  stepMyr = 0.5,
): number | null {
  const phase = (age: number) => (m * (orbit(-age) - ridge(-age))) / TWO_PI;
  let younger = minAgeMyr;
  let pYounger = phase(younger);
  if (pYounger === Math.floor(pYounger)) return younger;
  while (younger < maxAgeMyr) {
    const older = Math.min(maxAgeMyr, younger + stepMyr);
    const pOlder = phase(older);
    const turn = Math.floor(pYounger);
    if (Math.floor(pOlder) !== turn || pOlder === turn) {
      // The whole number crossed: turn when the phase falls with age, turn + 1 when it rises.
      const target = pOlder < pYounger ? turn : turn + 1;
      let lo = younger;
      let hi = older;
      while (hi - lo > 1e-7) {
        const mid = 0.5 * (lo + hi);
        if ((phase(mid) - target) * (pYounger - target) > 0) lo = mid;
        else hi = mid;
      }
      return 0.5 * (lo + hi);
    }
    younger = older;
    pYounger = pOlder;
  }
  return null;
}
