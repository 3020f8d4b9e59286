/** Units of angle a position or size column may carry. `sexagesimal` means text like 18:03:40.2. */
export type AngleUnit = 'deg' | 'rad' | 'hours' | 'arcmin' | 'arcsec' | 'mas' | 'sexagesimal';
export type VelocityUnit = 'km/s' | 'm/s';
export type DistanceUnit = 'kpc' | 'pc';

/** What a unit string measures, after {@link parseUnit}. */
export type ParsedUnit =
  | { kind: 'angle'; unit: AngleUnit }
  | { kind: 'velocity'; unit: VelocityUnit }
  | { kind: 'distance'; unit: DistanceUnit }
  | { kind: 'dimensionless' };

const UNIT_TABLE: Record<string, ParsedUnit> = {};
function add(parsed: ParsedUnit, ...names: string[]): void {
  for (const n of names) UNIT_TABLE[n] = parsed;
}
add({ kind: 'angle', unit: 'deg' }, 'deg', 'degree', 'degrees', 'degr', '°');
add({ kind: 'angle', unit: 'rad' }, 'rad', 'radian', 'radians');
add({ kind: 'angle', unit: 'hours' }, 'h', 'hr', 'hrs', 'hour', 'hours', 'hourangle');
add({ kind: 'angle', unit: 'arcmin' }, 'arcmin', 'amin', "'", '′', 'arcminute', 'arcminutes');
add({ kind: 'angle', unit: 'arcsec' }, 'arcsec', 'asec', '"', '″', 'arcsecond', 'arcseconds', "''");
add({ kind: 'angle', unit: 'mas' }, 'mas', 'milliarcsec');
add(
  { kind: 'angle', unit: 'sexagesimal' },
  'h:m:s',
  'd:m:s',
  'hms',
  'dms',
  '"h:m:s"',
  '"d:m:s"',
  'hh:mm:ss',
  'dd:mm:ss',
  'sexagesimal',
);
add(
  { kind: 'velocity', unit: 'km/s' },
  'km/s',
  'kms',
  'kms-1',
  'km.s-1',
  'kms^-1',
  'km/sec',
  'kmps',
  'kmsec-1',
);
add({ kind: 'velocity', unit: 'm/s' }, 'm/s', 'ms-1', 'm.s-1', 'ms^-1', 'm/sec', 'mps');
add({ kind: 'distance', unit: 'kpc' }, 'kpc', 'kiloparsec', 'kiloparsecs');
add({ kind: 'distance', unit: 'pc' }, 'pc', 'parsec', 'parsecs');
add({ kind: 'dimensionless' }, '', '-', '---', 'none');

/**
 * Reads a unit as written in a VOTable `unit` attribute or a column header (`deg`, `km/s`,
 * `km s-1`, `km.s-1`, `arcsec`, `"h:m:s"`, `kpc` …). Spaces and case are ignored. Returns
 * `null` for a unit Lanewise does not know; callers turn that into an error that names the column.
 */
export function parseUnit(text: string): ParsedUnit | null {
  const key = text
    .trim()
    .toLowerCase()
    .replace(/^\[(.*)\]$/, '$1')
    .replace(/\s+/g, '');
  return UNIT_TABLE[key] ?? null;
}

/** Factor from an angle unit to arcseconds (not for `hours` or `sexagesimal`, which are positions only). */
export const ARCSEC_PER: Record<'deg' | 'rad' | 'arcmin' | 'arcsec' | 'mas', number> = {
  deg: 3600,
  rad: (180 / Math.PI) * 3600,
  arcmin: 60,
  arcsec: 1,
  mas: 1e-3,
};

/** Factor from a velocity unit to km/s. */
export const KMS_PER: Record<VelocityUnit, number> = { 'km/s': 1, 'm/s': 1e-3 };

/** Factor from a distance unit to kpc. */
export const KPC_PER: Record<DistanceUnit, number> = { kpc: 1, pc: 1e-3 };
