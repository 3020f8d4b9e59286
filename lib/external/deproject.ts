/**
 * Deprojection of sky positions into the disc of a galaxy seen from outside. The sky offsets
 * from the centre are the gnomonic (tangent-plane) standard coordinates ξ (east) and η (north)
 * (Calabretta & Greisen 2002, A&A 395, 1077, the TAN projection), in radians; the disc frame has
 * x along the receding major axis and y across it, stretched by 1/cos i:
 *   x = ξ sin PA + η cos PA,   y = (−ξ cos PA + η sin PA) / cos i,   R = D √(x² + y²).
 * The disc's depth along the line of sight is neglected: the relative error is of order
 * (R/D) tan i, about 10⁻³ for a 10-kpc disc at 10 Mpc.
 *
 * atan2(y, x) grows clockwise on the sky (north up, east left: y points to PA − 90°); the
 * azimuth φ returned grows in the sense of rotation, so for a counterclockwise galaxy its sign
 * is flipped.
 */
import type { SkyRotationSense } from './types';

const DEG = Math.PI / 180;

/** The disc's orientation: centre, distance, inclination, PA of the receding major axis, rotation sense. */
export type DiscGeometry = {
  centerRaDeg: number;
  centerDecDeg: number;
  distanceMpc: number;
  inclinationDeg: number;
  positionAngleDeg: number;
  rotation: SkyRotationSense;
};

/**
 * Gnomonic standard coordinates ξ (toward east) and η (toward north), radians, of positions (RA,
 * Dec in deg) about a centre (deg). Throws RangeError naming the source (1-based) that lies 90°
 * or more from the centre, where the projection does not exist.
 */
export function tangentPlaneOffsets(
  raDeg: Float64Array,
  decDeg: Float64Array,
  centerRaDeg: number,
  centerDecDeg: number,
): { xiRad: Float64Array; etaRad: Float64Array } {
  const n = raDeg.length;
  const xiRad = new Float64Array(n);
  const etaRad = new Float64Array(n);
  const s0 = Math.sin(centerDecDeg * DEG);
  const c0 = Math.cos(centerDecDeg * DEG);
  for (let i = 0; i < n; i++) {
    const dRa = (raDeg[i] - centerRaDeg) * DEG;
    const sd = Math.sin(decDeg[i] * DEG);
    const cd = Math.cos(decDeg[i] * DEG);
    const cdc = cd * Math.cos(dRa);
    const cosC = s0 * sd + c0 * cdc;
    if (!(cosC > 0))
      throw new RangeError(
        `source ${i + 1} at (${raDeg[i]}, ${decDeg[i]}) is ≥ 90° from the centre`,
      );
    xiRad[i] = (cd * Math.sin(dRa)) / cosC;
    etaRad[i] = (c0 * sd - s0 * cdc) / cosC;
  }
  return { xiRad, etaRad };
}

/**
 * Disc radius R (kpc) and azimuth φ (rad, in (−π, π], growing in the sense of rotation, zero on
 * the receding major axis) of sky positions (RA, Dec in deg) for a disc geometry.
 */
export function deprojectToDisc(
  raDeg: Float64Array,
  decDeg: Float64Array,
  geometry: DiscGeometry,
): { RKpc: Float64Array; phiRad: Float64Array } {
  const { xiRad, etaRad } = tangentPlaneOffsets(
    raDeg,
    decDeg,
    geometry.centerRaDeg,
    geometry.centerDecDeg,
  );
  const sPa = Math.sin(geometry.positionAngleDeg * DEG);
  const cPa = Math.cos(geometry.positionAngleDeg * DEG);
  const cosI = Math.cos(geometry.inclinationDeg * DEG);
  const distKpc = geometry.distanceMpc * 1000;
  const sense = geometry.rotation === 'clockwise' ? 1 : -1;
  const n = raDeg.length;
  const RKpc = new Float64Array(n);
  const phiRad = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = xiRad[i] * sPa + etaRad[i] * cPa;
    const y = (-xiRad[i] * cPa + etaRad[i] * sPa) / cosI;
    RKpc[i] = distKpc * Math.hypot(x, y);
    phiRad[i] = Math.atan2(sense * y, x);
  }
  return { RKpc, phiRad };
}
