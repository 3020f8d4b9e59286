/**
 * Shared types of the cross-matcher. Positions are Galactic (IAU 1958) longitude `lDeg` and
 * latitude `bDeg` in degrees; velocities are LSR velocities in km/s. Every per-source quantity is a
 * flat typed array indexed by the source's row in its catalog (0-based), never one object per source.
 */

/**
 * One catalog as flat columns. All present arrays must have the same length.
 * - `lDeg`, `bDeg`: Galactic longitude (any finite value; taken modulo 360) and latitude in [−90, 90].
 * - `vKms`: LSR velocity in km/s; `NaN` marks a source without a velocity.
 * - `radiusArcsec`: angular radius of the source (arcsec, ≥ 0), used by the scaled match radius.
 * - `posErrArcsec`: 1σ position error (arcsec, ≥ 0), added in quadrature by the scaled radius.
 * - `lineWidthKms`: line width σ (km/s, ≥ 0), used by the scaled velocity window.
 */
export type SourceArrays = {
  lDeg: Float64Array;
  bDeg: Float64Array;
  vKms?: Float64Array;
  radiusArcsec?: Float64Array;
  posErrArcsec?: Float64Array;
  lineWidthKms?: Float64Array;
};

/** Match radius: one fixed radius, or scaled by the two sources' angular sizes (see tolerance.ts). */
export type RadiusRule =
  { mode: 'fixed'; arcsec: number } | { mode: 'scaled'; factor: number; minArcsec: number };

/** Velocity window on |v_B − v_A|: fixed, scaled by the two line widths, or not applied. */
export type VelocityRule =
  { mode: 'fixed'; kms: number } | { mode: 'scaled'; factor: number } | { mode: 'ignore' };

/**
 * Which links to keep among the pairs that pass both tolerances:
 * - `all`: every such pair;
 * - `nearest`: for each source of A, its best partner in B;
 * - `mutual`: pairs that are each other's best partner.
 * "Best" orders by smaller separation, then smaller |Δv| (a missing Δv sorts last), then lower index.
 */
export type LinkMode = 'all' | 'nearest' | 'mutual';

/** What to do with a source whose velocity is `NaN` when the velocity window is in use. */
export type MissingVelocityPolicy = 'exclude' | 'position-only';

/**
 * Tolerances and link mode of one match. `missingVelocity` must be given whenever the velocity
 * window is in use and any source of either catalog lacks a velocity; otherwise the match refuses
 * to run rather than guess.
 */
export type MatchParams = {
  radius: RadiusRule;
  velocity: VelocityRule;
  linkMode: LinkMode;
  missingVelocity?: MissingVelocityPolicy;
};

/**
 * The links of one catalog pair (A, B), sorted by `indexA` then `indexB`.
 * - `sepArcsec`: exact great-circle separation in arcsec;
 * - `dvKms`: v_B − v_A in km/s, `NaN` when either velocity is missing;
 * - `excludedA/B`: sources left out because their velocity is missing (policy `exclude`);
 * - `positionOnlyA/B`: sources without velocity that were linked on position only.
 */
export type LinkSet = {
  count: number;
  indexA: Uint32Array;
  indexB: Uint32Array;
  sepArcsec: Float64Array;
  dvKms: Float64Array;
  excludedA: number;
  excludedB: number;
  positionOnlyA: number;
  positionOnlyB: number;
};

/**
 * Reports progress in [0, 1] (reaches exactly 1 when done). It is called between chunks of work,
 * so it may also call `abort()` on the run's controller.
 */
export type ProgressCallback = (fraction: number) => void;

/** Options of long runs: progress and cancellation. */
export type RunOptions = {
  onProgress?: ProgressCallback;
  signal?: AbortSignal;
};
