import { z } from 'zod';

/**
 * FWHM of a Gaussian divided by its σ: 2√(2 ln 2) ≈ 2.35482 (common practice). Line widths
 * given as FWHM are divided by this to give the velocity dispersion σ.
 */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/**
 * Range rules of the canonical fields, checked on every row after unit conversion. Messages
 * are what a rejected row's reason says after the field and value.
 */
export const canonicalFieldSchemas = {
  lDeg: z.number().gte(-180, 'l must be in [−180°, 360°]').lte(360, 'l must be in [−180°, 360°]'),
  bDeg: z.number().gte(-90, '|b| must be ≤ 90°').lte(90, '|b| must be ≤ 90°'),
  vLsrKms: z.number().gt(-299792.458, '|v| must be below c').lt(299792.458, '|v| must be below c'),
  radiusArcsec: z.number().nonnegative('angular size must be ≥ 0'),
  posErrArcsec: z.number().nonnegative('position error must be ≥ 0'),
  vErrKms: z.number().nonnegative('velocity error must be ≥ 0'),
  sigmaVKms: z.number().nonnegative('line width must be ≥ 0'),
  distKpc: z.number().positive('distance must be > 0'),
  distErrKpc: z.number().nonnegative('distance error must be ≥ 0'),
} as const;

/** Numeric canonical fields, in the order of {@link CanonicalColumns}. */
export const NUMERIC_FIELDS = [
  'lDeg',
  'bDeg',
  'vLsrKms',
  'radiusArcsec',
  'posErrArcsec',
  'vErrKms',
  'sigmaVKms',
  'distKpc',
  'distErrKpc',
] as const;
export type NumericField = (typeof NUMERIC_FIELDS)[number];

/**
 * One source in canonical form: Galactic l ∈ [0, 360) and b (deg); v_LSR (km/s, radio
 * convention); angular radius, position error (arcsec); velocity error, line-width σ (km/s);
 * independent distance and its error (kpc); name. `null` where the catalog has no value.
 * `row` is the 1-based data row, `line` the file line; `original` holds the raw cells.
 */
export interface CanonicalRecord {
  row: number;
  line: number;
  lDeg: number;
  bDeg: number;
  vLsrKms: number | null;
  radiusArcsec: number | null;
  posErrArcsec: number | null;
  vErrKms: number | null;
  sigmaVKms: number | null;
  distKpc: number | null;
  distErrKpc: number | null;
  name: string | null;
  original: string[];
}

/**
 * A rejected row: its 1-based file line, its data-row number, and why, naming the field
 * (file column) and the value, e.g. ``field `glat` value `95.2`: |b| must be ≤ 90°``.
 */
export interface Rejection {
  row: number;
  line: number;
  reason: string;
}

/** The full sentence for a rejection, e.g. ``line 12: field `glat` value `95.2`: |b| must be ≤ 90°``. */
export function rejectionMessage(r: Rejection): string {
  return `line ${r.line}: ${r.reason}`;
}

/**
 * Accepted rows of a batch, column by column: flat Float64Arrays (NaN = no value) for the
 * numeric fields, plus data-row numbers, file lines, names and the raw cells for export.
 */
export interface CanonicalColumns {
  count: number;
  row: Uint32Array;
  line: Uint32Array;
  lDeg: Float64Array;
  bDeg: Float64Array;
  vLsrKms: Float64Array;
  radiusArcsec: Float64Array;
  posErrArcsec: Float64Array;
  vErrKms: Float64Array;
  sigmaVKms: Float64Array;
  distKpc: Float64Array;
  distErrKpc: Float64Array;
  name: (string | null)[];
  original: string[][];
}
