import { z } from 'zod';

const column = z.string().min(1, 'column name must not be empty');
const velocityUnit = z.enum(['km/s', 'm/s']);
const sizeUnit = z.enum(['arcsec', 'arcmin', 'deg', 'mas', 'rad']);
const distanceUnit = z.enum(['kpc', 'pc']);

/** Galactic l/b columns: decimal degrees or radians. */
const galacticPosition = z.object({
  system: z.literal('galactic'),
  lon: z.object({ column, unit: z.enum(['deg', 'rad']) }),
  lat: z.object({ column, unit: z.enum(['deg', 'rad']) }),
});

/**
 * Equatorial J2000/ICRS columns. RA: decimal degrees, decimal hours, radians or sexagesimal
 * hours (`18:03:40.2`, `18h03m40.2s`); Dec: decimal degrees, radians or sexagesimal degrees.
 */
const equatorialPosition = z.object({
  system: z.literal('equatorial'),
  lon: z.object({ column, unit: z.enum(['deg', 'hours', 'rad', 'sexagesimal']) }),
  lat: z.object({ column, unit: z.enum(['deg', 'rad', 'sexagesimal']) }),
});

/**
 * The saved column mapping of a catalog: which file column holds each canonical field, in
 * which unit, frame and convention. Only `position` is required. Sizes: `radius` is taken as
 * is, `diameter` and `fwhm` (a Gaussian's full width at half maximum) are halved. Line widths:
 * `fwhm` is divided by 2√(2 ln 2) ≈ 2.3548 to give σ, `sigma` is taken as is. The distance error
 * has its own unit (default: the distance's).
 */
export const mappingSchema = z
  .object({
    position: z.discriminatedUnion('system', [galacticPosition, equatorialPosition]),
    velocity: z
      .object({
        column,
        unit: velocityUnit,
        frame: z.enum(['lsr', 'heliocentric']),
        convention: z.enum(['radio', 'optical', 'relativistic']),
      })
      .optional(),
    size: z
      .object({ column, unit: sizeUnit, kind: z.enum(['radius', 'diameter', 'fwhm']) })
      .optional(),
    positionError: z.object({ column, unit: sizeUnit }).optional(),
    velocityError: z.object({ column, unit: velocityUnit }).optional(),
    lineWidth: z.object({ column, unit: velocityUnit, kind: z.enum(['fwhm', 'sigma']) }).optional(),
    distance: z.object({ column, unit: distanceUnit }).optional(),
    distanceError: z.object({ column, unit: distanceUnit }).optional(),
    name: z.object({ column }).optional(),
  })
  .superRefine((m, ctx) => {
    if (m.position.lon.column === m.position.lat.column) {
      ctx.addIssue({
        code: 'custom',
        path: ['position', 'lat', 'column'],
        message: `longitude and latitude cannot both come from column \`${m.position.lon.column}\``,
      });
    }
    if (m.distanceError && !m.distance) {
      ctx.addIssue({
        code: 'custom',
        path: ['distanceError'],
        message: 'a distance error needs a distance column',
      });
    }
  });

/** A saved column mapping (see {@link mappingSchema}). */
export type Mapping = z.infer<typeof mappingSchema>;

/** Every file column a mapping reads, in a stable order, without repeats. */
export function mappedColumns(m: Mapping): string[] {
  const cols = [m.position.lon.column, m.position.lat.column];
  for (const key of [
    'velocity',
    'size',
    'positionError',
    'velocityError',
    'lineWidth',
    'distance',
    'distanceError',
    'name',
  ] as const) {
    const f = m[key];
    if (f) cols.push(f.column);
  }
  return [...new Set(cols)];
}
