/**
 * Plain-words warnings with counts for an ordering result: what was left out and why, and where
 * a number rests on little data or leaves an error out (warn, don't hide).
 */
import { r0Mismatch } from '@/lib/astro/arm-rescale';
import { EXCLUSION_REASONS, EXCLUSION_WORDS, type ExclusionReason } from './exclusions';

/** Statistics over fewer complexes than this get a warning that their intervals are fragile. */
export const FEW_COMPLEXES = 10;

/** Counts the warnings are written from. */
export type WarningCounts = {
  complexes: number;
  used: number;
  reasons: Record<ExclusionReason, number>;
  velocityFallback: number;
  independentInsteadOfKinematic: number;
  /** Used complexes whose near/far draws split between 20 % and 80 %. */
  ambiguousNearFar: number;
  gasComplexes: number;
  youngComplexes: number;
  constantsWithoutError: boolean;
  armsR0Kpc: number | null;
  curveR0Kpc: number;
};

/** The warnings, in a fixed order; empty when nothing needs saying. */
export function warningsFor(w: WarningCounts): string[] {
  const out: string[] = [];
  const of = `of ${w.complexes} complex${w.complexes === 1 ? '' : 'es'}`;
  for (const r of EXCLUSION_REASONS)
    if (w.reasons[r] > 0) out.push(`${w.reasons[r]} ${of} left out: ${EXCLUSION_WORDS[r]}.`);
  if (w.complexes > 0 && w.used === 0)
    out.push('No complex could be used, so there are no class offsets.');
  if (w.velocityFallback > 0)
    out.push(
      `${w.velocityFallback} ${of} have no gas member with a velocity; their kinematic distance uses the velocities of all their members.`,
    );
  if (w.independentInsteadOfKinematic > 0)
    out.push(
      `${w.independentInsteadOfKinematic} ${of} use a member's independent distance because their kinematic distance is missing or unreliable.`,
    );
  if (w.ambiguousNearFar > 0)
    out.push(
      `${w.ambiguousNearFar} used complex${w.ambiguousNearFar === 1 ? ' has' : 'es have'} near/far draws split between 20 % and 80 %: both placements enter their intervals.`,
    );
  if (w.used > 0 && (w.gasComplexes < FEW_COMPLEXES || w.youngComplexes < FEW_COMPLEXES))
    out.push(
      `Only ${w.gasComplexes} used complexes have gas members and ${w.youngComplexes} have young-star members; the class intervals rest on few complexes.`,
    );
  if (w.constantsWithoutError)
    out.push(
      "The rotation curve's R0 and Θ0 carry no uncertainty in this analysis (the preset states none and none was given), so the intervals leave the Galactic constants out.",
    );
  const mismatch = w.armsR0Kpc === null ? null : r0Mismatch(w.armsR0Kpc, w.curveR0Kpc);
  if (mismatch) out.push(mismatch.warning);
  return out;
}
