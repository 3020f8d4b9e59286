/**
 * The demo galaxy's own rotation curve, deliberately none of the analysis presets: an arctangent
 * rise (the arctan model of Courteau 1997, AJ 114, 2402) with a gentle linear outer decline (the
 * Milky Way's is about −1.7 km/s/kpc, Eilers et al. 2019, ApJ 871, 120),
 *   Θ(R) = V_a (2/π) arctan(R / r_t) + g (R − R0),
 * with V_a set so that Θ(R0) = Θ0. It is tabulated on a fine grid and used as a 'table' curve of
 * `@/lib/astro/rotation-curves`, so the truth file carries the exact curve the sources were made
 * with and {@link galaxyCurve} rebuilds it from the truth alone.
 */
import { makeRotationCurve, type RotationCurve } from '@/lib/astro/rotation-curves';
import type { GalaxyTruth } from './truth';

/** Constants of the generator's rotation curve (kpc, km/s). */
export type GalaxyCurveParams = {
  /** Sun–centre distance R0. */
  R0Kpc: number;
  /** Circular speed at R0. */
  theta0Kms: number;
  /** Turnover radius r_t of the arctangent rise. */
  turnoverKpc: number;
  /** Outer gradient g = dΘ/dR far beyond the turnover (km/s/kpc). */
  outerSlopeKmsKpc: number;
  /** Tabulation grid: rows every stepKpc from stepKpc to maxKpc (linear interpolation between). */
  stepKpc: number;
  maxKpc: number;
};

/** Θ (km/s) at R (kpc) of the analytic form above. */
export function galaxyThetaKms(p: GalaxyCurveParams, RKpc: number): number {
  const rise = (R: number) => (2 / Math.PI) * Math.atan(R / p.turnoverKpc);
  const amplitude = p.theta0Kms / rise(p.R0Kpc);
  return amplitude * rise(RKpc) + p.outerSlopeKmsKpc * (RKpc - p.R0Kpc);
}

/** The (R kpc, Θ km/s) rows of the tabulated curve: every stepKpc up to maxKpc, and R0. */
export function galaxyCurveTable(p: GalaxyCurveParams): Array<[number, number]> {
  if (!(p.stepKpc > 0 && p.maxKpc > p.stepKpc)) {
    throw new RangeError(
      `galaxy curve grid: stepKpc = ${p.stepKpc}, maxKpc = ${p.maxKpc} must satisfy 0 < step < max`,
    );
  }
  const n = Math.floor(p.maxKpc / p.stepKpc + 1e-9);
  const radii: number[] = [];
  for (let k = 1; k <= n; k++) radii.push(Number((k * p.stepKpc).toFixed(9)));
  // R0 is a row of its own so that Θ(R0) = Θ0 exactly, as the LSR formula assumes.
  if (!radii.includes(p.R0Kpc)) radii.push(p.R0Kpc);
  radii.sort((a, b) => a - b);
  return radii.map((R) => [R, galaxyThetaKms(p, R)]);
}

/** The generator's rotation curve built from its constants (a 'table' curve with R0 = p.R0Kpc). */
export function makeGalaxyCurve(p: GalaxyCurveParams): RotationCurve {
  return makeRotationCurve('table', { table: galaxyCurveTable(p), R0Kpc: p.R0Kpc });
}

/**
 * Rebuilds the generator's rotation curve from a truth record (its table rows and R0), e.g. to
 * compare an analysis with the curve the demo data were made with.
 */
export function galaxyCurve(truth: GalaxyTruth): RotationCurve {
  const { table, R0Kpc } = truth.rotationCurve;
  return makeRotationCurve('table', { table: table.map(([R, t]) => [R, t]), R0Kpc });
}
