/**
 * Why a complex is left out of the ordering statistics. Each excluded complex gets exactly one
 * reason, the first that applies in the order listed here; excluded complexes stay in the
 * result's complex table with their reason, and every count is reported (warn, don't hide).
 */

/** Exclusion reasons, in the order they are tested. */
export const EXCLUSION_REASONS = [
  'no-velocity',
  'unreliable-longitude',
  'beyond-terminal',
  'near-tangent',
  'no-distance',
  'unresolved-near-far',
  'off-arm',
] as const;

/** One exclusion reason. */
export type ExclusionReason = (typeof EXCLUSION_REASONS)[number];

import { UNRELIABLE_LONGITUDE_DEG, isUnreliableLongitude } from '@/lib/astro/kinematic-distance';

/** Half-width (deg) of the windows around l = 0° and 180° excluded: the one rule of `lib/astro/kinematic-distance`. */
export const UNRELIABLE_LONGITUDE_EXCLUSION_DEG = UNRELIABLE_LONGITUDE_DEG;
export { isUnreliableLongitude };

/** Plain words for each reason, used in warnings. */
export const EXCLUSION_WORDS: Readonly<Record<ExclusionReason, string>> = {
  'no-velocity': 'no member has a velocity and there is no independent or hand-set distance',
  'unreliable-longitude': `kinematic distance within ${UNRELIABLE_LONGITUDE_EXCLUSION_DEG}° of l = 0° or 180°, where it is unreliable`,
  'beyond-terminal': 'velocity beyond the terminal velocity (placed at the tangent point)',
  'near-tangent':
    'velocity within streaming motions of the terminal velocity, so near and far cannot be told apart',
  'no-distance': 'no kinematic distance exists for the velocity (e.g. a forbidden velocity)',
  'unresolved-near-far':
    'near/far ambiguity not resolved (no independent distance, latitude cannot decide)',
  'off-arm':
    'farther from every arm ridge than the arm width, or beyond the end of its nearest arm',
};

/** Counts of every reason (zero included) for the reasons given per complex (null = used). */
export function countReasons(
  reasons: ReadonlyArray<ExclusionReason | null>,
): Record<ExclusionReason, number> {
  const counts = Object.fromEntries(EXCLUSION_REASONS.map((r) => [r, 0])) as Record<
    ExclusionReason,
    number
  >;
  for (const r of reasons) if (r !== null) counts[r]++;
  return counts;
}
