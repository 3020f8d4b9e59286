/**
 * Decimal places of every quantity Lanewise exports (docs/methods.md, "Exports"). They are
 * fixed per quantity, not per file: finer than any tracer catalog measures, coarse enough
 * that conversions (RA/Dec → l, b; arcmin → arcsec; frames) leave no floating-point noise.
 * Original columns are never rounded: they are written as uploaded.
 */
export const EXPORT_DECIMALS = {
  /** Galactic l, b: 1e-8° = 36 µas. */
  positionDeg: 8,
  /** Angles derived by an analysis (Galactocentric azimuth, offsets in azimuth): 1e-4°. */
  angleDeg: 4,
  /** Separations, radii, position errors and match radii: 0.1 mas. */
  angleArcsec: 4,
  /** Velocities, their differences, errors and line widths: 1 m/s. */
  velocityKms: 3,
  /** Distances, coordinates and offsets in kpc: 0.1 pc. */
  lengthKpc: 4,
  /** Reliabilities, probabilities and shares (0 to 1). */
  fraction: 4,
} as const;

export type ExportQuantity = keyof typeof EXPORT_DECIMALS;

/** The same table in words, for methods.json. */
export const EXPORT_PRECISION_TEXT: { quantity: string; unit: string; decimals: number }[] = [
  {
    quantity: 'Galactic longitude and latitude',
    unit: 'deg',
    decimals: EXPORT_DECIMALS.positionDeg,
  },
  {
    quantity: 'angles of an analysis (azimuth, azimuth offsets, β)',
    unit: 'deg',
    decimals: EXPORT_DECIMALS.angleDeg,
  },
  {
    quantity: 'separations, radii, position errors, match radii',
    unit: 'arcsec',
    decimals: EXPORT_DECIMALS.angleArcsec,
  },
  {
    quantity: 'velocities, velocity differences and errors, line widths σ',
    unit: 'km/s',
    decimals: EXPORT_DECIMALS.velocityKms,
  },
  {
    quantity: 'distances, Galactocentric coordinates, offsets',
    unit: 'kpc',
    decimals: EXPORT_DECIMALS.lengthKpc,
  },
  {
    quantity: 'reliabilities, probabilities, shares',
    unit: '',
    decimals: EXPORT_DECIMALS.fraction,
  },
];
