/**
 * What the external-galaxy figures draw, apart from how: the fitted Δφ(R) curve, the arm ridges
 * in the face-on disc, and the marks of the gas and young-star classes.
 */
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { ridgeAzimuthRad } from '@/lib/external/arms-fit';
import type { ExternalRotationCurve } from '@/lib/external/rotation';
import type { LogSpiralArms } from '@/lib/external/types';
import { DEFAULT_GAS_KINDS, DEFAULT_YOUNG_KINDS } from '@/lib/external/types';
import { tracerStyle, type TracerKind } from '@/lib/tracers';
import type { ExternalFitJson } from './types';

const DEG = Math.PI / 180;

/**
 * The fitted model at radius RKpc, in degrees: Δφ = 1.0227·10⁻³ (Ω(R) − Ω_p) t (Egusa et al.
 * 2004, PASJ 56, L45) with Ω(R) from the galaxy's rotation curve, Ω_p and t from the fit. Where
 * Ω_p is not constrained the fitted straight line Δφ = a Ω(R) + b is the same model without a
 * zero crossing to name, and is drawn instead; null when no slope was fitted.
 */
export function modelDphiDeg(
  fit: Pick<
    ExternalFitJson,
    'timescaleMyr' | 'patternSpeedKmsKpc' | 'slopeRadPerKmsKpc' | 'interceptRad'
  >,
  curve: ExternalRotationCurve,
  RKpc: number,
): number | null {
  const omega = curve.omegaKmsKpc(RKpc);
  if (fit.timescaleMyr !== null && fit.patternSpeedKmsKpc !== null)
    return (KMS_KPC_PER_MYR * (omega - fit.patternSpeedKmsKpc) * fit.timescaleMyr) / DEG;
  if (fit.slopeRadPerKmsKpc === null || fit.interceptRad === null) return null;
  return (fit.slopeRadPerKmsKpc * omega + fit.interceptRad) / DEG;
}

/**
 * The m ridge lines of log-spiral arms between two radii as (x, y) kpc points in the face-on
 * disc, x along φ = 0 (the receding major axis) and φ counterclockwise in the sense of rotation.
 */
export function armRidgesXY(
  arms: LogSpiralArms,
  minKpc: number,
  maxKpc: number,
  steps = 120,
): [number, number][][] {
  const lo = Math.max(minKpc, 1e-3);
  return Array.from({ length: arms.m }, (_, k) =>
    Array.from({ length: steps + 1 }, (_, i): [number, number] => {
      const R = lo * (maxKpc / lo) ** (i / steps);
      const phi = ridgeAzimuthRad(arms, R) + (2 * Math.PI * k) / arms.m;
      return [R * Math.cos(phi), R * Math.sin(phi)];
    }),
  );
}

/** The role a tracer kind plays in the analysis. */
export type ClassRole = 'gas' | 'young' | 'other';

/** Gas, young stars, or neither, by the analysis's kinds (`lib/external/types` defaults). */
export function roleOfKind(
  kind: TracerKind,
  gasKinds: readonly TracerKind[] = DEFAULT_GAS_KINDS,
  youngKinds: readonly TracerKind[] = DEFAULT_YOUNG_KINDS,
): ClassRole {
  return gasKinds.includes(kind) ? 'gas' : youngKinds.includes(kind) ? 'young' : 'other';
}

/** "young stars (HII) minus gas (CO)": the kinds of each class that were analysed. */
export function classWords(
  present: readonly TracerKind[],
  gasKinds: readonly TracerKind[] = DEFAULT_GAS_KINDS,
  youngKinds: readonly TracerKind[] = DEFAULT_YOUNG_KINDS,
): { gas: string; young: string } {
  const words = (kinds: readonly TracerKind[]) => {
    const used = kinds.filter((k) => present.includes(k));
    return (used.length ? used : kinds).map((k) => tracerStyle(k).label).join(', ');
  };
  return { gas: `gas (${words(gasKinds)})`, young: `young stars (${words(youngKinds)})` };
}
