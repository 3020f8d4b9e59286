/**
 * Velocities: heliocentric ↔ LSR corrections and the radio / optical / relativistic velocity
 * conventions. Velocities in km/s, positive away from the observer; angles in degrees;
 * frequencies in Hz.
 */

const DEG = Math.PI / 180;

/** Speed of light in km/s (exact, SI definition of the metre). */
export const SPEED_OF_LIGHT_KMS = 299792.458;

/** Rest frequencies in Hz: HI 21 cm hyperfine line and CO J=1–0 (standard line lists; docs/methods.md, "Velocities"). */
export const REST_FREQUENCY_HZ = { HI: 1420405751.768, CO_1_0: 115271201800 } as const;

/** Solar motion relative to a local standard of rest: U toward l = 0, V toward l = 90°, W toward the north Galactic pole (km/s). */
export type SolarMotion = { uKms: number; vKms: number; wKms: number };

/**
 * The kinematic ("standard") LSR used by radio surveys: 20.0 km/s toward α = 18h, δ = +30°
 * (B1900), i.e. (U, V, W) = (10.27, 15.32, 7.74) km/s. Common practice.
 */
export const KINEMATIC_LSR: SolarMotion = Object.freeze({ uKms: 10.27, vKms: 15.32, wKms: 7.74 });

/** The dynamical LSR of Schönrich, Binney & Dehnen (2010): (U, V, W) = (11.1, 12.24, 7.25) km/s. */
export const DYNAMICAL_LSR: SolarMotion = Object.freeze({ uKms: 11.1, vKms: 12.24, wKms: 7.25 });

/** Projection of the solar motion (km/s) onto the line of sight toward Galactic (l, b) in degrees. */
export function solarMotionProjectionKms(
  lDeg: number,
  bDeg: number,
  solarMotion: SolarMotion = KINEMATIC_LSR,
): number {
  const cb = Math.cos(bDeg * DEG);
  return (
    solarMotion.uKms * Math.cos(lDeg * DEG) * cb +
    solarMotion.vKms * Math.sin(lDeg * DEG) * cb +
    solarMotion.wKms * Math.sin(bDeg * DEG)
  );
}

/**
 * LSR radial velocity (km/s) from a heliocentric one at Galactic (l, b) in degrees:
 * v_LSR = v_helio + U cos l cos b + V sin l cos b + W sin b (common practice). Both velocities
 * must use the same (non-relativistic-sense) convention; the correction is a small additive term.
 */
export function helioToLsrKms(
  vHelioKms: number,
  lDeg: number,
  bDeg: number,
  solarMotion: SolarMotion = KINEMATIC_LSR,
): number {
  return vHelioKms + solarMotionProjectionKms(lDeg, bDeg, solarMotion);
}

/** Heliocentric radial velocity (km/s) from an LSR one at Galactic (l, b) in degrees; inverse of {@link helioToLsrKms}. */
export function lsrToHelioKms(
  vLsrKms: number,
  lDeg: number,
  bDeg: number,
  solarMotion: SolarMotion = KINEMATIC_LSR,
): number {
  return vLsrKms - solarMotionProjectionKms(lDeg, bDeg, solarMotion);
}

/**
 * Velocity conventions: radio v = c (1 − ν/ν₀); optical v = c (ν₀/ν − 1); relativistic
 * ν/ν₀ = √((1 − β)/(1 + β)), β = v/c.
 */
export type VelocityConvention = 'radio' | 'optical' | 'relativistic';

/** Frequency ratio ν/ν₀ for a velocity (km/s) in a convention; throws RangeError where the convention has no frequency. */
function ratioFromVelocity(vKms: number, convention: VelocityConvention): number {
  const beta = vKms / SPEED_OF_LIGHT_KMS;
  let ratio: number;
  if (convention === 'radio') ratio = 1 - beta;
  else if (convention === 'optical') ratio = 1 / (1 + beta);
  else ratio = Math.sqrt((1 - beta) / (1 + beta));
  if (!(ratio > 0) || !Number.isFinite(ratio)) {
    throw new RangeError(`velocity ${vKms} km/s has no frequency in the ${convention} convention`);
  }
  return ratio;
}

function velocityFromRatio(ratio: number, convention: VelocityConvention): number {
  if (!(ratio > 0) || !Number.isFinite(ratio)) {
    throw new RangeError(`frequency ratio ${ratio} must be positive and finite`);
  }
  if (convention === 'radio') return SPEED_OF_LIGHT_KMS * (1 - ratio);
  if (convention === 'optical') return SPEED_OF_LIGHT_KMS * (1 / ratio - 1);
  const r2 = ratio * ratio;
  return (SPEED_OF_LIGHT_KMS * (1 - r2)) / (1 + r2);
}

/**
 * Converts a radial velocity (km/s) between conventions exactly, through the frequency ratio
 * ν/ν₀ the velocity stands for. Throws RangeError for velocities outside a convention's domain
 * (e.g. radio v ≥ c, optical v ≤ −c, relativistic |v| ≥ c).
 */
export function convertVelocityConvention(
  vKms: number,
  from: VelocityConvention,
  to: VelocityConvention,
): number {
  if (from === to) return vKms;
  return velocityFromRatio(ratioFromVelocity(vKms, from), to);
}

/** Radial velocity (km/s) in a convention for an observed frequency and a rest frequency (Hz). */
export function frequencyToVelocityKms(
  freqHz: number,
  restHz: number,
  convention: VelocityConvention,
): number {
  return velocityFromRatio(freqHz / restHz, convention);
}

/** Observed frequency (Hz) for a radial velocity (km/s) in a convention and a rest frequency (Hz). */
export function velocityToFrequencyHz(
  vKms: number,
  restHz: number,
  convention: VelocityConvention,
): number {
  return restHz * ratioFromVelocity(vKms, convention);
}
