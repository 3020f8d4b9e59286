/**
 * Cross-match of several catalogs: every pair (i, j) with i < j, catalog i playing A.
 */
import { MatchInputError } from './errors';
import { preparePair, runPair } from './engine';
import { ProgressTracker, throwIfCancelled } from './progress';
import { buildSkyIndex, type SkyIndex } from './skyIndex';
import type { LinkSet, MatchParams, RunOptions, SourceArrays } from './types';

/** The links of one catalog pair; `catA` (playing A) and `catB` are positions in the input list. */
export type CatalogPairLinks = { catA: number; catB: number; links: LinkSet };

/**
 * Options of `matchMany`: `pairs` restricts the run to these catalog pairs (each [i, j], i ≠ j,
 * in the given order, i playing A); `indices` reuses prebuilt indices (`indices[j]` must come from
 * `buildSkyIndex(catalogs[j])`).
 */
export type MatchManyOptions = RunOptions & {
  pairs?: Array<[number, number]>;
  indices?: Array<SkyIndex | undefined>;
};

function allPairs(n: number): Array<[number, number]> {
  const pairs: Array<[number, number]> = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) pairs.push([i, j]);
  return pairs;
}

/**
 * Matches every chosen pair of catalogs with the same parameters (see `matchCatalogs` for the
 * rule, units and frames) and returns the links per pair. Each catalog is indexed at most once.
 * Progress is shared out over the pairs in proportion to their sizes.
 */
export async function matchMany(
  catalogs: SourceArrays[],
  params: MatchParams,
  options: MatchManyOptions = {},
): Promise<{ pairs: CatalogPairLinks[] }> {
  throwIfCancelled(options.signal);
  const chosen = options.pairs ?? allPairs(catalogs.length);
  for (const [i, j] of chosen) {
    if (!catalogs[i] || !catalogs[j] || i === j) {
      throw new MatchInputError(
        `catalog pair [${i}, ${j}] is not a pair of two of the ${catalogs.length} catalogs.`,
      );
    }
  }
  const indices: Array<SkyIndex | undefined> = catalogs.map((_, k) => options.indices?.[k]);
  const weights = chosen.map(([i, j]) => catalogs[i].lDeg.length + catalogs[j].lDeg.length + 1);
  const total = weights.reduce((sum, w) => sum + w, 0);
  const tracker = new ProgressTracker(options.onProgress, options.signal);
  const result: CatalogPairLinks[] = [];
  let done = 0;
  for (let p = 0; p < chosen.length; p++) {
    const [i, j] = chosen[p];
    indices[j] ??= buildSkyIndex(catalogs[j], String(j));
    const pair = preparePair(catalogs[i], catalogs[j], params, indices[j], [String(i), String(j)]);
    const links = await runPair(pair, 0, tracker.sub(done / total, (done + weights[p]) / total));
    result.push({ catA: i, catB: j, links });
    done += weights[p];
  }
  tracker.complete();
  return { pairs: result };
}
