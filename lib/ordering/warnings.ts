/**
 * Plain-words warnings with counts for an ordering result: what was left out and why, and where
 * a number rests on little data (warn, don't hide).
 */
import { EXCLUSION_REASONS, EXCLUSION_WORDS, type ExclusionReason } from './exclusions';

/** Gas→stars samples smaller than this get a warning that the interval and p-value are fragile. */
export const FEW_COMPLEXES = 10;

/** Counts the warnings are written from. */
export type WarningCounts = {
  complexes: number;
  used: number;
  reasons: Record<ExclusionReason, number>;
  velocityFallback: number;
  independentInsteadOfKinematic: number;
  straddlingCorotation: number;
  nearCorotationDelays: number;
  orbitAlongSight: number;
  gasToStars: number;
  corotationKpc: number | null;
  allInside: boolean;
};

/** The warnings, in a fixed order; empty when nothing needs saying. */
export function warningsFor(w: WarningCounts): string[] {
  const out: string[] = [];
  const of = `of ${w.complexes} complex${w.complexes === 1 ? '' : 'es'}`;
  for (const r of EXCLUSION_REASONS)
    if (w.reasons[r] > 0) out.push(`${w.reasons[r]} ${of} left out: ${EXCLUSION_WORDS[r]}.`);
  if (w.complexes > 0 && w.used === 0)
    out.push('No complex could be used, so there are no ordering statistics.');
  if (w.velocityFallback > 0)
    out.push(
      `${w.velocityFallback} ${of} have no gas member with a velocity; their kinematic distance uses the velocities of all their members.`,
    );
  if (w.independentInsteadOfKinematic > 0)
    out.push(
      `${w.independentInsteadOfKinematic} ${of} use a member's independent distance because their kinematic distance is missing or unreliable.`,
    );
  if (w.corotationKpc === null)
    out.push(
      `The rotation curve never meets the pattern speed, so every complex counts as ${w.allInside ? 'inside' : 'outside'} corotation.`,
    );
  if (w.straddlingCorotation > 0)
    out.push(
      `${w.straddlingCorotation} used complex${w.straddlingCorotation === 1 ? '' : 'es'} have a distance interval reaching across corotation (R = ${w.corotationKpc?.toFixed(2)} kpc); left out of the downstream-signed statistics (classes, gas→stars, delay, KS) but kept in the radial bins.`,
    );
  if (w.orbitAlongSight > 0)
    out.push(
      `${w.orbitAlongSight} used complex${w.orbitAlongSight === 1 ? '' : 'es'} with gas and young stars lie where the orbit runs within 30° of the line of sight, so their gas→stars displacement cannot be deprojected; left out of gas→stars, delay and radial bins.`,
    );
  if (w.nearCorotationDelays > 0)
    out.push(
      `${w.nearCorotationDelays} complex${w.nearCorotationDelays === 1 ? '' : 'es'} lie so close to corotation (|Ω − Ω_p| < 10 % of Ω_p) that no delay was computed for them.`,
    );
  if (w.used > 0 && w.gasToStars < FEW_COMPLEXES)
    out.push(
      `Only ${w.gasToStars} used complex${w.gasToStars === 1 ? ' has' : 'es have'} both gas and young-star members; the gas→stars interval and p-value rest on very few complexes.`,
    );
  return out;
}
