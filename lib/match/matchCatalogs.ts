/**
 * Cross-match of two catalogs by Galactic position and LSR velocity.
 */
import { runPair, preparePair } from './engine';
import { ProgressTracker, throwIfCancelled } from './progress';
import type { SkyIndex } from './skyIndex';
import type { LinkSet, MatchParams, RunOptions, SourceArrays } from './types';

/** Options of `matchCatalogs`; `indexB` reuses an index built with `buildSkyIndex(b)`. */
export type MatchCatalogsOptions = RunOptions & { indexB?: SkyIndex };

/**
 * Links sources of catalog A to sources of catalog B (positions in Galactic degrees, velocities
 * LSR km/s). A pair links when its exact great-circle separation is within the pair's radius and
 * |v_B − v_A| within the pair's velocity window (tolerance.ts); `params.linkMode` then keeps all
 * such pairs, each A source's best partner, or mutual best partners (best = smaller separation,
 * then smaller |Δv|, then lower index). Links are sorted by A index then B index; `dvKms` is
 * v_B − v_A. Sources without a velocity are excluded or linked on position only per
 * `params.missingVelocity`, and counted in the result. Throws `MatchInputError` for bad input and
 * `MatchCancelledError` when `signal` aborts.
 */
export async function matchCatalogs(
  a: SourceArrays,
  b: SourceArrays,
  params: MatchParams,
  options: MatchCatalogsOptions = {},
): Promise<LinkSet> {
  throwIfCancelled(options.signal);
  const tracker = new ProgressTracker(options.onProgress, options.signal);
  const pair = preparePair(a, b, params, options.indexB);
  const links = await runPair(pair, 0, tracker);
  tracker.complete();
  return links;
}
