/**
 * Puts points of the synthetic disc on the sky with 3-D vectors and full perspective: the disc
 * is a plane through the galaxy's centre at distanceMpc, with x along the receding major axis
 * (position angle PA east of north) and y tilted by the inclination out of the sky plane, and
 * each point's direction from the observer gives its RA and Dec. The near side is chosen so that
 * the major axis at PA recedes for the stated sense of rotation.
 */
import type { SkyRotationSense } from '@/lib/external/types';

const DEG = Math.PI / 180;

/** Where and how the disc lies on the sky. */
export type SkyPlacement = {
  centerRaDeg: number;
  centerDecDeg: number;
  distanceMpc: number;
  inclinationDeg: number;
  positionAngleDeg: number;
  rotation: SkyRotationSense;
};

/** RA (deg, [0, 360)) and Dec (deg) of disc points (R kpc, φ rad growing in the sense of rotation). */
export function discToSky(
  RKpc: Float64Array,
  phiRad: Float64Array,
  sky: SkyPlacement,
): { raDeg: Float64Array; decDeg: Float64Array } {
  const a0 = sky.centerRaDeg * DEG;
  const d0 = sky.centerDecDeg * DEG;
  const los = [Math.cos(d0) * Math.cos(a0), Math.cos(d0) * Math.sin(a0), Math.sin(d0)];
  const east = [-Math.sin(a0), Math.cos(a0), 0];
  const north = [-Math.sin(d0) * Math.cos(a0), -Math.sin(d0) * Math.sin(a0), Math.cos(d0)];
  const pa = sky.positionAngleDeg * DEG;
  const inc = sky.inclinationDeg * DEG;
  // The sky's x→y turn is clockwise; a counterclockwise disc runs the other way, and its far side flips.
  const sense = sky.rotation === 'clockwise' ? 1 : -1;
  const major = [0, 1, 2].map((k) => Math.sin(pa) * east[k] + Math.cos(pa) * north[k]);
  const minorSky = [0, 1, 2].map((k) => -Math.cos(pa) * east[k] + Math.sin(pa) * north[k]);
  const minor = [0, 1, 2].map((k) => Math.cos(inc) * minorSky[k] + sense * Math.sin(inc) * los[k]);
  const distKpc = sky.distanceMpc * 1000;
  const n = RKpc.length;
  const raDeg = new Float64Array(n);
  const decDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = RKpc[i] * Math.cos(phiRad[i]);
    const y = sense * RKpc[i] * Math.sin(phiRad[i]);
    const p = [0, 1, 2].map((k) => distKpc * los[k] + x * major[k] + y * minor[k]);
    const ra = Math.atan2(p[1], p[0]) / DEG;
    raDeg[i] = ra < 0 ? ra + 360 : ra;
    decDeg[i] = Math.atan2(p[2], Math.hypot(p[0], p[1])) / DEG;
  }
  return { raDeg, decDeg };
}
