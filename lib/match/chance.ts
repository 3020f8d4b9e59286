/**
 * Chance links by shifted repeats (common practice): the match is repeated with catalog A rotated
 * in Galactic longitude by each offset, which keeps each catalog's own latitude and velocity
 * distribution and its clustering but destroys true associations. Rotating A by −s is the same as
 * rotating B by +s (separations are unchanged by a rotation about the Galactic poles).
 *
 * - expected chance links per pair = mean link count over the K shifts; its standard error is the
 *   scatter over shifts, sd/√K (sample sd, K − 1 in the denominator);
 * - reliability of a link (common practice, per-bin ratio of chance to real links): the links are
 *   binned in u = (sep/R)², R the pair's own radius, into equal-area bins of the match disc; in bin
 *   k the reliability is 1 − N_chance,k / N_real,k, clipped to [0, 1], with N_chance,k the mean
 *   count over the shifts.
 */
import { MatchInputError } from './errors';
import { preparePair, runPair } from './engine';
import { ProgressTracker, throwIfCancelled } from './progress';
import type { SkyIndex } from './skyIndex';
import { pairRadiusArcsec } from './tolerance';
import type { LinkSet, MatchParams, RadiusRule, RunOptions, SourceArrays } from './types';

/** Default longitude offsets in degrees: ±1°…±5°. */
export const DEFAULT_SHIFTS_DEG: readonly number[] = [-5, -4, -3, -2, -1, 1, 2, 3, 4, 5];

/** Options of `estimateChanceLinks`: offsets (deg, nonzero), number of separation bins (≥ 1). */
export type ChanceOptions = RunOptions & {
  shiftsDeg?: readonly number[];
  bins?: number;
  indexB?: SkyIndex;
};

/**
 * The real links with their chance-link estimate. `perShift[k]` is the link count with A rotated
 * by `shiftsDeg[k]`; `binEdges` are the edges of the separation bins in units of the pair radius
 * (sep/R, from 0 to 1); `reliability[k]` belongs to link k of `links`; `overallReliability` is
 * 1 − expected / observed (clipped to [0, 1]; NaN without links); `stdErr` is NaN for a single shift.
 */
export type ChanceEstimate = {
  links: LinkSet;
  shiftsDeg: Float64Array;
  perShift: Float64Array;
  expected: number;
  stdErr: number;
  binEdges: Float64Array;
  observedPerBin: Float64Array;
  expectedPerBin: Float64Array;
  reliability: Float32Array;
  overallReliability: number;
};

function binOf(
  rule: RadiusRule,
  a: SourceArrays,
  b: SourceArrays,
  i: number,
  j: number,
  sepArcsec: number,
  bins: number,
): number {
  const radiusArcsec = pairRadiusArcsec(
    rule,
    a.radiusArcsec ? a.radiusArcsec[i] : 0,
    b.radiusArcsec ? b.radiusArcsec[j] : 0,
    a.posErrArcsec ? a.posErrArcsec[i] : 0,
    b.posErrArcsec ? b.posErrArcsec[j] : 0,
  );
  if (!(radiusArcsec > 0)) return 0;
  const ratio = sepArcsec / radiusArcsec;
  return Math.min(bins - 1, Math.floor(ratio * ratio * bins));
}

function countPerBin(
  links: LinkSet,
  rule: RadiusRule,
  a: SourceArrays,
  b: SourceArrays,
  bins: number,
  into: Float64Array,
  weight: number,
  binOfLink?: Uint32Array,
): void {
  for (let k = 0; k < links.count; k++) {
    const bin = binOf(rule, a, b, links.indexA[k], links.indexB[k], links.sepArcsec[k], bins);
    into[bin] += weight;
    if (binOfLink) binOfLink[k] = bin;
  }
}

/**
 * Matches A with B (as `matchCatalogs`, same units and frames) and estimates how many of the links
 * are chance coincidences by repeating the match with A rotated in longitude by each of
 * `shiftsDeg` (default ±1°…±5°). Returns the real links, the expected number of chance links with
 * its standard error, and a reliability per link. Throws `MatchInputError` for bad input or
 * offsets and `MatchCancelledError` when `signal` aborts.
 */
export async function estimateChanceLinks(
  a: SourceArrays,
  b: SourceArrays,
  params: MatchParams,
  options: ChanceOptions = {},
): Promise<ChanceEstimate> {
  throwIfCancelled(options.signal);
  const shifts = options.shiftsDeg ?? DEFAULT_SHIFTS_DEG;
  const bins = options.bins ?? 10;
  if (shifts.length === 0) throw new MatchInputError('shiftsDeg must hold at least one offset.');
  shifts.forEach((s, k) => {
    if (!Number.isFinite(s) || s % 360 === 0) {
      throw new MatchInputError(
        `shiftsDeg[${k}] = ${s} is not a nonzero longitude offset in degrees.`,
      );
    }
  });
  if (!Number.isInteger(bins) || bins < 1) {
    throw new MatchInputError(`bins must be a whole number ≥ 1, got ${bins}.`);
  }

  const pair = preparePair(a, b, params, options.indexB);
  const tracker = new ProgressTracker(options.onProgress, options.signal);
  const runs = shifts.length + 1;
  const links = await runPair(pair, 0, tracker.sub(0, 1 / runs));
  const observedPerBin = new Float64Array(bins);
  const binOfLink = new Uint32Array(links.count);
  countPerBin(links, params.radius, a, b, bins, observedPerBin, 1, binOfLink);

  const perShift = new Float64Array(shifts.length);
  const expectedPerBin = new Float64Array(bins);
  for (let k = 0; k < shifts.length; k++) {
    const shifted = await runPair(pair, shifts[k], tracker.sub((k + 1) / runs, (k + 2) / runs));
    perShift[k] = shifted.count;
    countPerBin(shifted, params.radius, a, b, bins, expectedPerBin, 1 / shifts.length);
  }

  const K = shifts.length;
  const expected = perShift.reduce((sum, n) => sum + n, 0) / K;
  const variance =
    K > 1 ? perShift.reduce((sum, n) => sum + (n - expected) ** 2, 0) / (K - 1) : NaN;
  const reliability = new Float32Array(links.count);
  for (let k = 0; k < links.count; k++) {
    const bin = binOfLink[k];
    reliability[k] = Math.min(1, Math.max(0, 1 - expectedPerBin[bin] / observedPerBin[bin]));
  }
  const binEdges = new Float64Array(bins + 1);
  for (let k = 0; k <= bins; k++) binEdges[k] = Math.sqrt(k / bins);
  tracker.complete();
  return {
    links,
    shiftsDeg: Float64Array.from(shifts),
    perShift,
    expected,
    stdErr: Math.sqrt(variance / K),
    binEdges,
    observedPerBin,
    expectedPerBin,
    reliability,
    overallReliability:
      links.count > 0 ? Math.min(1, Math.max(0, 1 - expected / links.count)) : NaN,
  };
}
