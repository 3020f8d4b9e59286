/**
 * The rotation curve of a galaxy seen from outside: circular speed V(R) (km/s) against disc
 * radius R (kpc), flat or read from a table by linear interpolation, and the angular speed
 * Ω = V/R (km/s/kpc). Inside the first table row the curve rises linearly from V(0) = 0 (solid
 * body); beyond the last it stays at the last speed (flat).
 */
import { validateRotationCurveSpec, type ExternalRotationCurveSpec } from './types';

/** A rotation curve: circular speed and angular speed at a radius. */
export type ExternalRotationCurve = {
  thetaKms(RKpc: number): number;
  omegaKmsKpc(RKpc: number): number;
};

function checkRadius(RKpc: number): void {
  if (!(RKpc > 0) || !Number.isFinite(RKpc))
    throw new RangeError(`rotation curve radius RKpc = ${RKpc} must be positive and finite`);
}

/** The curve of a spec (validated; RangeError names `rotationCurve.<field>`). */
export function makeExternalRotationCurve(spec: ExternalRotationCurveSpec): ExternalRotationCurve {
  validateRotationCurveSpec(spec, 'rotationCurve');
  const theta = spec.kind === 'flat' ? () => spec.vKms : tableTheta(spec.points);
  return {
    thetaKms(RKpc) {
      checkRadius(RKpc);
      return theta(RKpc);
    },
    omegaKmsKpc(RKpc) {
      checkRadius(RKpc);
      return theta(RKpc) / RKpc;
    },
  };
}

function tableTheta(points: ReadonlyArray<readonly [number, number]>): (RKpc: number) => number {
  const R = Float64Array.from(points, (p) => p[0]);
  const V = Float64Array.from(points, (p) => p[1]);
  const last = R.length - 1;
  return (RKpc) => {
    if (RKpc <= R[0]) return (V[0] * RKpc) / R[0];
    if (RKpc >= R[last]) return V[last];
    let lo = 0;
    let hi = last;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (R[mid] <= RKpc) lo = mid;
      else hi = mid;
    }
    return V[lo] + ((RKpc - R[lo]) / (R[hi] - R[lo])) * (V[hi] - V[lo]);
  };
}
