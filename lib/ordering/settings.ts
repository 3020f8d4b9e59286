/**
 * Validation of the analysis settings: every number is checked before any work starts, and an
 * error names the setting and its value.
 */
import type { OrderingComplex, OrderingSettings } from './types';

/** Fewest bootstrap resamples / permutations accepted (SCIENCE.md §6: ≥ 2 000). */
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
  if (!(s.patternSpeedKmsKpc >= 0 && s.patternSpeedKmsKpc < Infinity))
    fail('patternSpeedKmsKpc', s.patternSpeedKmsKpc, 'must be a non-negative number of km/s/kpc');
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
