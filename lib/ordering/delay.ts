/**
 * Star-formation delay implied by each complex's azimuthal gas→stars offset (SCIENCE.md §6):
 * t = Δβ / (Ω(R) − Ω_p) with Ω = Θ/R (`delayMyr` of `@/lib/astro/pattern-speed`), in Myr,
 * positive when the young stars lie downstream of the gas. Near corotation Ω − Ω_p → 0 and the
 * delay blows up, so complexes with |Ω(R) − Ω_p| < 10 % of Ω_p are left out (common practice
 * of excluding the corotation zone), as are complexes whose side of corotation is not known.
 */
import { angularSpeedKmsKpc, delayMyr } from '@/lib/astro/pattern-speed';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { bootstrapCenters } from './cluster-bootstrap';
import type { OrderingResult } from './types';

/** Fraction of Ω_p within which Ω(R) counts as too close to the pattern speed for a delay. */
export const NEAR_COROTATION_FRACTION = 0.1;

/** True when |Ω(R) − Ω_p| < {@link NEAR_COROTATION_FRACTION} · Ω_p at RKpc. */
export function nearCorotation(
  RKpc: number,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
): boolean {
  return (
    Math.abs(angularSpeedKmsKpc(RKpc, curve) - patternSpeedKmsKpc) <
    NEAR_COROTATION_FRACTION * patternSpeedKmsKpc
  );
}

/**
 * Delays (Myr) of the used complexes with s ≠ 0, a finite Δβ (deg, positive ahead) and R away
 * from corotation, with their median and bootstrap 95 % interval; `nearCorotationCount` counts
 * complexes left out for being near corotation.
 */
export function delaySummary(
  dBetaDeg: Float64Array,
  RKpc: Float64Array,
  used: Uint8Array,
  flowSign: Int8Array,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
  resamples: number,
  seed: number,
): { summary: OrderingResult['delayMyr']; nearCorotationCount: number } {
  const delays: number[] = [];
  let nearCount = 0;
  for (let c = 0; c < dBetaDeg.length; c++) {
    if (!used[c] || flowSign[c] === 0 || !(dBetaDeg[c] === dBetaDeg[c])) continue;
    if (nearCorotation(RKpc[c], curve, patternSpeedKmsKpc)) {
      nearCount++;
      continue;
    }
    delays.push(delayMyr(dBetaDeg[c], RKpc[c], curve, patternSpeedKmsKpc));
  }
  const b = bootstrapCenters(Float64Array.from(delays), resamples, seed);
  return {
    summary: { n: delays.length, median: b ? b.median : null, ci95: b ? b.medianCi : null },
    nearCorotationCount: nearCount,
  };
}
