/**
 * Input checks of the matcher. Every failure throws a `MatchInputError` that names the catalog,
 * the field, the 0-based row and the offending value, so a caller can point the user at the line.
 */
import { MatchInputError } from './errors';
import type { MatchParams, SourceArrays } from './types';

const OPTIONAL_COLUMNS = ['vKms', 'radiusArcsec', 'posErrArcsec', 'lineWidthKms'] as const;

function requireNonNegative(value: number, what: string): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new MatchInputError(`${what} must be a finite number ≥ 0, got ${value}.`);
  }
}

/** Checks tolerances and link mode; throws `MatchInputError` on the first bad value. */
export function validateParams(params: MatchParams): void {
  const { radius, velocity, linkMode, missingVelocity } = params;
  if (radius.mode === 'fixed') requireNonNegative(radius.arcsec, 'radius.arcsec');
  else if (radius.mode === 'scaled') {
    requireNonNegative(radius.factor, 'radius.factor');
    requireNonNegative(radius.minArcsec, 'radius.minArcsec');
  } else
    throw new MatchInputError(
      `radius.mode must be 'fixed' or 'scaled', got ${String((radius as { mode: unknown }).mode)}.`,
    );
  if (velocity.mode === 'fixed') requireNonNegative(velocity.kms, 'velocity.kms');
  else if (velocity.mode === 'scaled') requireNonNegative(velocity.factor, 'velocity.factor');
  else if (velocity.mode !== 'ignore') {
    throw new MatchInputError(
      `velocity.mode must be 'fixed', 'scaled' or 'ignore', got ${String((velocity as { mode: unknown }).mode)}.`,
    );
  }
  if (linkMode !== 'all' && linkMode !== 'nearest' && linkMode !== 'mutual') {
    throw new MatchInputError(
      `linkMode must be 'all', 'nearest' or 'mutual', got ${String(linkMode)}.`,
    );
  }
  if (
    missingVelocity !== undefined &&
    missingVelocity !== 'exclude' &&
    missingVelocity !== 'position-only'
  ) {
    throw new MatchInputError(
      `missingVelocity must be 'exclude' or 'position-only', got ${String(missingVelocity)}.`,
    );
  }
}

/** Checks the positions only: equal lengths, finite l, b within [−90, 90]. */
export function validatePositions(src: SourceArrays, label: string): void {
  const { lDeg, bDeg } = src;
  if (!(lDeg instanceof Float64Array) || !(bDeg instanceof Float64Array)) {
    throw new MatchInputError(`catalog ${label}: lDeg and bDeg must be Float64Array.`);
  }
  if (lDeg.length !== bDeg.length) {
    throw new MatchInputError(
      `catalog ${label}: lDeg has ${lDeg.length} rows but bDeg has ${bDeg.length}.`,
    );
  }
  for (let i = 0; i < lDeg.length; i++) {
    if (!Number.isFinite(lDeg[i])) {
      throw new MatchInputError(
        `catalog ${label}: lDeg[${i}] = ${lDeg[i]} is not a finite longitude.`,
      );
    }
    const b = bDeg[i];
    if (!(b >= -90 && b <= 90)) {
      throw new MatchInputError(`catalog ${label}: bDeg[${i}] = ${b} is outside [-90, 90].`);
    }
  }
}

function checkColumn(
  column: Float64Array,
  label: string,
  name: string,
  vKms: Float64Array | undefined,
  onlyWithVelocity: boolean,
): void {
  for (let i = 0; i < column.length; i++) {
    if (onlyWithVelocity && !(vKms !== undefined && vKms[i] === vKms[i])) continue;
    const x = column[i];
    if (!(x >= 0 && x < Infinity)) {
      throw new MatchInputError(
        `catalog ${label}: ${name}[${i}] = ${x} must be a finite number ≥ 0.`,
      );
    }
  }
}

/**
 * Checks one catalog against the parameters: positions, column lengths, velocities finite or NaN,
 * and the columns the scaled tolerances read (radii and errors ≥ 0; line widths ≥ 0 wherever a
 * velocity is present; line widths required for the scaled window).
 */
export function validateCatalog(src: SourceArrays, label: string, params: MatchParams): void {
  validatePositions(src, label);
  const n = src.lDeg.length;
  for (const name of OPTIONAL_COLUMNS) {
    const column = src[name];
    if (column === undefined) continue;
    if (!(column instanceof Float64Array)) {
      throw new MatchInputError(`catalog ${label}: ${name} must be a Float64Array.`);
    }
    if (column.length !== n) {
      throw new MatchInputError(
        `catalog ${label}: ${name} has ${column.length} rows but lDeg has ${n}.`,
      );
    }
  }
  const { vKms } = src;
  if (vKms !== undefined) {
    for (let i = 0; i < n; i++) {
      if (vKms[i] === Infinity || vKms[i] === -Infinity) {
        throw new MatchInputError(
          `catalog ${label}: vKms[${i}] = ${vKms[i]} is not finite (use NaN for a missing velocity).`,
        );
      }
    }
  }
  if (params.radius.mode === 'scaled') {
    if (src.radiusArcsec) checkColumn(src.radiusArcsec, label, 'radiusArcsec', vKms, false);
    if (src.posErrArcsec) checkColumn(src.posErrArcsec, label, 'posErrArcsec', vKms, false);
  }
  if (params.velocity.mode === 'scaled') {
    if (!src.lineWidthKms) {
      throw new MatchInputError(`catalog ${label}: the scaled velocity window needs lineWidthKms.`);
    }
    checkColumn(src.lineWidthKms, label, 'lineWidthKms', vKms, true);
  }
}

/** Number of sources of a catalog without a velocity (all of them when `vKms` is absent). */
export function countMissingVelocity(src: SourceArrays): number {
  const { vKms } = src;
  if (!vKms) return src.lDeg.length;
  let missing = 0;
  for (let i = 0; i < vKms.length; i++) if (vKms[i] !== vKms[i]) missing++;
  return missing;
}
