/**
 * Validation of the analysis settings: every number is checked before any work starts, and an
 * error names the setting and its value.
 */
import type { NearFarRule, OrderingComplex, OrderingSettings } from './types';

/** The near/far rules of the distance draws. */
export const NEAR_FAR_RULES: readonly NearFarRule[] = [
  'probabilistic',
  'near',
  'far',
  'latitude',
  'independent',
];

/** Fewest bootstrap resamples / permutations accepted (≥ 2 000, docs/methods.md "Intervals"). */
export const MIN_RESAMPLES = 2000;

function fail(field: string, value: unknown, rule: string): never {
  throw new RangeError(`settings.${field} = ${JSON.stringify(value)} ${rule}`);
}

/** Throws RangeError for the first invalid setting (see {@link OrderingSettings} for units). */
export function validateSettings(s: OrderingSettings): void {
  if (!s.curve || typeof s.curve.thetaKms !== 'function')
    fail('curve', s.curve, 'is not a rotation curve');
  if (!Array.isArray(s.arms) || s.arms.length === 0)
    fail('arms', s.arms, 'must list at least one arm');
  if (!(s.armWidthKpc > 0 && s.armWidthKpc < Infinity))
    fail('armWidthKpc', s.armWidthKpc, 'must be a positive number of kpc');
  if (
    s.patternSpeedKmsKpc !== null &&
    !(s.patternSpeedKmsKpc > 0 && s.patternSpeedKmsKpc < Infinity)
  )
    fail(
      'patternSpeedKmsKpc',
      s.patternSpeedKmsKpc,
      'must be null or a positive number of km/s/kpc',
    );
  if (!(s.R0ErrKpc >= 0 && s.R0ErrKpc < 2))
    fail('R0ErrKpc', s.R0ErrKpc, 'must be a number of kpc in [0, 2)');
  if (!(s.theta0ErrKms >= 0 && s.theta0ErrKms < 50))
    fail('theta0ErrKms', s.theta0ErrKms, 'must be a number of km/s in [0, 50)');
  if (!NEAR_FAR_RULES.includes(s.nearFar))
    fail('nearFar', s.nearFar, `must be one of ${NEAR_FAR_RULES.join(', ')}`);
  if (
    s.linkRadiusArcsec !== null &&
    !(s.linkRadiusArcsec[0] > 0 && s.linkRadiusArcsec[1] >= s.linkRadiusArcsec[0])
  )
    fail(
      'linkRadiusArcsec',
      s.linkRadiusArcsec,
      'must be null or [smallest, largest] positive radii',
    );
  if (!(s.sigmaStreamKms >= 0 && s.sigmaStreamKms < Infinity))
    fail('sigmaStreamKms', s.sigmaStreamKms, 'must be a non-negative number of km/s');
  if (!(s.scaleHeightKpc > 0 && s.scaleHeightKpc < Infinity))
    fail('scaleHeightKpc', s.scaleHeightKpc, 'must be a positive number of kpc');
  if (s.velocityFrom !== 'gas' && s.velocityFrom !== 'all')
    fail('velocityFrom', s.velocityFrom, "must be 'gas' or 'all'");
  if (!Number.isInteger(s.resamples) || s.resamples < MIN_RESAMPLES)
    fail('resamples', s.resamples, `must be an integer ≥ ${MIN_RESAMPLES}`);
  if (!Number.isFinite(s.seed)) fail('seed', s.seed, 'must be a finite number');
  if (!Number.isInteger(s.mcDraws) || s.mcDraws < 1)
    fail('mcDraws', s.mcDraws, 'must be a positive integer');
}

/** Throws RangeError for a distance override that is not a positive finite distance, naming the complex. */
export function validateOverrides(complexes: OrderingComplex[]): void {
  complexes.forEach((cx, c) => {
    const o = cx.distanceOverride;
    if (o === undefined || o === null) return;
    if (!(o.distKpc > 0 && o.distKpc < Infinity))
      throw new RangeError(
        `complex ${JSON.stringify(cx.id)} (#${c + 1}): distanceOverride.distKpc = ${o.distKpc} must be a positive number of kpc`,
      );
  });
}
