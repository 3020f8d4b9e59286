/**
 * The gas-to-young-star displacement of each complex (docs/methods.md, "Within complexes"), from the centroid of its
 * gas members (HI, CO) to the centroid of its young-star members (HII, OB).
 *
 * All members share the complex's distance, so only the component of the displacement across
 * the line of sight is observed: in the Galactic plane, w = (c_young − c_gas)·ŵ with ŵ the
 * in-plane unit vector perpendicular to the line of sight. Taking the across-arm component of
 * that projected vector would mix in the unseen line-of-sight part (its sign can even flip), so
 * the displacement is deprojected under the density-wave picture that is being tested: in the
 * frame of the pattern, material — and the stars it forms — moves along its circular orbit
 * (Roberts 1969; azimuthal offsets as in Egusa et al. 2009), so the displacement is S ê_β with
 * S = w / (ê_β·ŵ) (kpc, positive ahead in rotation). Complexes where the orbit runs within 30° of
 * the line of sight (|ê_β·ŵ| < 0.5) cannot be deprojected and are left out. S ê_β is then split
 * into
 * - across = S (ê_β·n̂): the component along the ridge normal n̂ of the complex's arm, n̂ pointing
 *   ahead in the sense of rotation (across > 0: the young stars lie farther ahead of the ridge
 *   than the gas, measured perpendicular to the ridge; for a log spiral of pitch ψ, S sin ψ);
 * - along = S (ê_β·t̂): the component along the ridge tangent t̂ ⟂ n̂, oriented toward increasing
 *   azimuth β;
 * and the azimuth offset Δβ = S / R (radians converted to deg, positive ahead). Under the null of no ordering w is
 * symmetric about 0 and so is S, whatever the geometry, so tests on these values stay valid.
 */
import { azimuthDeg, ROTATION_SENSE } from '@/lib/astro/galactocentric';
import { isGasKind, isYoungKind } from './members';

const DEG = Math.PI / 180;

/** Smallest |ê_β·ŵ| (the sine of the angle between the orbit and the line of sight) that is deprojected. */
export const MIN_ORBIT_TRANSVERSE = 0.5;

/**
 * Splits an in-plane vector (dx, dy) kpc into its across-arm and along-arm parts for a ridge with
 * unit normal (nx, ny) pointing ahead, at azimuth betaDeg (which orients the tangent toward
 * increasing β). Returns kpc.
 */
export function decomposeVector(
  dxKpc: number,
  dyKpc: number,
  nx: number,
  ny: number,
  betaDeg: number,
): { acrossKpc: number; alongKpc: number } {
  const e = aheadUnit(betaDeg);
  let tx = -ny;
  let ty = nx;
  if (tx * e.x + ty * e.y < 0) {
    tx = -tx;
    ty = -ty;
  }
  return { acrossKpc: dxKpc * nx + dyKpc * ny, alongKpc: dxKpc * tx + dyKpc * ty };
}

/** Unit vector of increasing β (ahead in rotation) at azimuth betaDeg: (−sin β, −cos β) in this frame. */
function aheadUnit(betaDeg: number): { x: number; y: number } {
  return {
    x: -Math.sin(betaDeg * DEG) * ROTATION_SENSE,
    y: -Math.cos(betaDeg * DEG) * ROTATION_SENSE,
  };
}

/**
 * Deprojects an observed in-plane displacement (dx, dy) kpc of a complex at (xKpc, yKpc), seen
 * from the Sun at (R0Kpc, 0), onto its orbit direction: S = (d·ŵ)/(ê_β·ŵ) (kpc, positive ahead),
 * or NaN when |ê_β·ŵ| < {@link MIN_ORBIT_TRANSVERSE}.
 */
export function orbitDisplacementKpc(
  dxKpc: number,
  dyKpc: number,
  xKpc: number,
  yKpc: number,
  R0Kpc: number,
): number {
  const ux = xKpc - R0Kpc;
  const uy = yKpc;
  const len = Math.hypot(ux, uy);
  if (!(len > 0)) return NaN;
  const wx = -uy / len;
  const wy = ux / len;
  const e = aheadUnit(azimuthDeg(xKpc, yKpc));
  const q = e.x * wx + e.y * wy;
  if (!(Math.abs(q) >= MIN_ORBIT_TRANSVERSE)) return NaN;
  return (dxKpc * wx + dyKpc * wy) / q;
}

/** Per-complex gas-to-young-star parts (NaN where a complex lacks gas or young stars or a position). */
export type GasToStarsColumns = {
  acrossKpc: Float64Array;
  alongKpc: Float64Array;
  dBetaDeg: Float64Array;
  /** 1 where the complex has gas and young stars but its orbit runs too close to the line of sight. */
  orbitAlongSight: Uint8Array;
};

/**
 * Computes {@link GasToStarsColumns}. Members are rows start[c] … start[c + 1] − 1 with kind
 * indices and in-plane positions (kpc, placed at their complex's distance); complexes carry their
 * position, azimuth and ridge normal from placement; R0Kpc places the Sun.
 */
export function gasToStarsColumns(
  start: Int32Array,
  kind: Uint8Array,
  memberX: Float64Array,
  memberY: Float64Array,
  complexX: Float64Array,
  complexY: Float64Array,
  normalX: Float64Array,
  normalY: Float64Array,
  R0Kpc: number,
): GasToStarsColumns {
  const n = start.length - 1;
  const out: GasToStarsColumns = {
    acrossKpc: new Float64Array(n).fill(NaN),
    alongKpc: new Float64Array(n).fill(NaN),
    dBetaDeg: new Float64Array(n).fill(NaN),
    orbitAlongSight: new Uint8Array(n),
  };
  for (let c = 0; c < n; c++) {
    let gx = 0;
    let gy = 0;
    let ng = 0;
    let sx = 0;
    let sy = 0;
    let ns = 0;
    for (let i = start[c]; i < start[c + 1]; i++) {
      if (isGasKind(kind[i])) {
        gx += memberX[i];
        gy += memberY[i];
        ng++;
      } else if (isYoungKind(kind[i])) {
        sx += memberX[i];
        sy += memberY[i];
        ns++;
      }
    }
    if (ng === 0 || ns === 0 || !(normalX[c] === normalX[c]) || !(gx === gx)) continue;
    const S = orbitDisplacementKpc(
      sx / ns - gx / ng,
      sy / ns - gy / ng,
      complexX[c],
      complexY[c],
      R0Kpc,
    );
    if (!(S === S)) {
      out.orbitAlongSight[c] = 1;
      continue;
    }
    const R = Math.hypot(complexX[c], complexY[c]);
    const beta = azimuthDeg(complexX[c], complexY[c]);
    const e = aheadUnit(beta);
    const parts = decomposeVector(S * e.x, S * e.y, normalX[c], normalY[c], beta);
    out.acrossKpc[c] = parts.acrossKpc;
    out.alongKpc[c] = parts.alongKpc;
    out.dBetaDeg[c] = S / R / DEG;
  }
  return out;
}
