/**
 * The Galactocentric frame used everywhere in Lanewise. This is the only module that states it;
 * every other module imports it from here.
 *
 * Convention (Reid et al. 2014, ApJ 783, 130, §5 and Fig. 1):
 * - Origin at the Galactic centre; the Sun lies on the positive x axis at (R0, 0, 0).
 * - z points to the north Galactic pole; the frame is right-handed, so the direction of Galactic
 *   longitude l = 90° (the direction of the Sun's orbital motion) is −y.
 * - Galactocentric azimuth β is 0 toward the Sun and increases with Galactic longitude, i.e.
 *   clockwise as seen from the north Galactic pole: β = atan2(−y, x).
 * - The disc rotates clockwise seen from the north Galactic pole, the same sense as increasing β
 *   (see {@link ROTATION_SENSE}). "Ahead" of a spiral-arm ridge therefore means larger β at the
 *   same radius.
 *
 * A heliocentric point at longitude l, latitude b and line-of-sight distance d sits at
 * x = R0 − d cos b cos l, y = −d cos b sin l, z = d sin b (the Sun is taken to lie in the plane).
 */

const DEG = Math.PI / 180;

/** A position in the Galactocentric frame: Cartesian kpc, cylindrical radius R (kpc) and azimuth β (deg, in (−180, 180]). */
export type GalactocentricPoint = {
  xKpc: number;
  yKpc: number;
  zKpc: number;
  RKpc: number;
  betaDeg: number;
};

/**
 * Sign of dβ/dt for circular disc rotation in this frame: +1, because the Galaxy rotates
 * clockwise seen from the north Galactic pole and β increases clockwise (Reid et al. 2014).
 * Multiply an azimuth difference by this to get "positive = ahead in the sense of rotation".
 */
export const ROTATION_SENSE = 1 as const;

/** Galactocentric azimuth β (deg, (−180, 180]) of an in-plane position (kpc) in this frame. */
export function azimuthDeg(xKpc: number, yKpc: number): number {
  return Math.atan2(-yKpc, xKpc) / DEG;
}

/** In-plane position (kpc) of a point at Galactocentric radius R (kpc) and azimuth β (deg). */
export function polarToXy(RKpc: number, betaDeg: number): { xKpc: number; yKpc: number } {
  return { xKpc: RKpc * Math.cos(betaDeg * DEG), yKpc: -RKpc * Math.sin(betaDeg * DEG) };
}

/**
 * Galactocentric position of a source at Galactic longitude l and latitude b (deg) and
 * line-of-sight distance distKpc from the Sun, for a Sun–centre distance R0Kpc. Cartesian and
 * cylindrical coordinates in kpc, azimuth β in degrees, in the frame stated above.
 */
export function toGalactocentric(
  lDeg: number,
  bDeg: number,
  distKpc: number,
  R0Kpc: number,
): GalactocentricPoint {
  const dPlane = distKpc * Math.cos(bDeg * DEG);
  const xKpc = R0Kpc - dPlane * Math.cos(lDeg * DEG);
  const yKpc = -dPlane * Math.sin(lDeg * DEG);
  const zKpc = distKpc * Math.sin(bDeg * DEG);
  return { xKpc, yKpc, zKpc, RKpc: Math.hypot(xKpc, yKpc), betaDeg: azimuthDeg(xKpc, yKpc) };
}

/**
 * Heliocentric Galactic longitude and latitude (deg, l in [0, 360)) and line-of-sight distance
 * (kpc) of a Galactocentric position (kpc) for a Sun–centre distance R0Kpc. Inverse of
 * {@link toGalactocentric}.
 */
export function fromGalactocentric(
  xKpc: number,
  yKpc: number,
  zKpc: number,
  R0Kpc: number,
): { lDeg: number; bDeg: number; distKpc: number } {
  const hx = R0Kpc - xKpc;
  const hy = -yKpc;
  const dPlane = Math.hypot(hx, hy);
  let lDeg = Math.atan2(hy, hx) / DEG;
  if (lDeg < 0) lDeg += 360;
  if (lDeg >= 360) lDeg -= 360;
  return { lDeg, bDeg: Math.atan2(zKpc, dPlane) / DEG, distKpc: Math.hypot(dPlane, zKpc) };
}
