import type { Mapping } from './mapping';
import { splitNameUnit } from './suggest';
import type { TableHeader } from './types';

const UNIT_WORDS: Record<string, string> = {
  deg: 'degrees',
  rad: 'radians',
  hours: 'hours',
  sexagesimal: 'sexagesimal text',
  arcsec: 'arcsec',
  arcmin: 'arcmin',
  mas: 'mas',
  'km/s': 'km/s',
  'm/s': 'm/s',
  kpc: 'kpc',
  pc: 'pc',
};

/**
 * Every assumption the normaliser makes when it reads a file with this mapping, as sentences
 * for the preview and the catalog page: how positions, sizes, velocities and widths are read,
 * each unit the file does not state itself, the fields the catalog lacks, and decimal commas.
 * A reader of the catalog should be able to tell from this list alone what was taken for granted.
 */
export function mappingAssumptions(
  header: TableHeader,
  mapping: Mapping,
  options: { decimalComma?: boolean } = {},
): string[] {
  const out: string[] = [];
  const stated = new Set(
    header.columns
      .filter((c) => (c.unit !== undefined && c.unit.trim() !== '') || splitNameUnit(c.name).unit)
      .map((c) => c.name),
  );
  const unit = (column: string, u: string): string =>
    stated.has(column)
      ? `in ${UNIT_WORDS[u] ?? u}`
      : `in ${UNIT_WORDS[u] ?? u} (the file does not state a unit; assumed)`;

  const p = mapping.position;
  if (p.system === 'galactic') {
    out.push(
      `Position: Galactic longitude from \`${p.lon.column}\` ${unit(p.lon.column, p.lon.unit)} and latitude from \`${p.lat.column}\` ${unit(p.lat.column, p.lat.unit)}; longitudes are wrapped into [0°, 360°).`,
    );
  } else {
    out.push(
      `Position: right ascension from \`${p.lon.column}\` ${unit(p.lon.column, p.lon.unit)} and declination from \`${p.lat.column}\` ${unit(p.lat.column, p.lat.unit)}, taken as J2000 (ICRS) equatorial coordinates and rotated to Galactic l, b.`,
    );
  }

  const v = mapping.velocity;
  if (v) {
    const frame =
      v.frame === 'lsr'
        ? 'already LSR (kept as is)'
        : 'heliocentric, shifted to the LSR with the standard solar motion';
    const convention =
      v.convention === 'radio'
        ? 'radio convention (kept as is)'
        : `${v.convention} convention, converted exactly to the radio convention`;
    out.push(`Velocity from \`${v.column}\` ${unit(v.column, v.unit)}: ${frame}; ${convention}.`);
  } else {
    out.push('No velocity column: sources have no v_LSR.');
  }

  const size = mapping.size;
  if (size) {
    const how =
      size.kind === 'radius'
        ? 'a radius (kept as is)'
        : size.kind === 'diameter'
          ? 'a diameter (halved to the stored radius)'
          : 'a Gaussian FWHM (halved to the stored radius)';
    out.push(`Size from \`${size.column}\` ${unit(size.column, size.unit)}, read as ${how}.`);
  } else {
    out.push('No size column: sources have no angular size.');
  }

  const w = mapping.lineWidth;
  if (w) {
    const how =
      w.kind === 'sigma'
        ? 'a dispersion σ (kept as is)'
        : 'a FWHM (divided by 2√(2 ln 2) ≈ 2.355 to give σ)';
    out.push(`Line width from \`${w.column}\` ${unit(w.column, w.unit)}, read as ${how}.`);
  } else {
    out.push('No line-width column: sources have no line width.');
  }

  const pe = mapping.positionError;
  if (pe) out.push(`Position error from \`${pe.column}\` ${unit(pe.column, pe.unit)}.`);
  else out.push('No position-error column: position errors are left empty.');
  const ve = mapping.velocityError;
  if (ve) out.push(`Velocity error from \`${ve.column}\` ${unit(ve.column, ve.unit)}.`);
  else if (v) out.push('No velocity-error column: velocity errors are left empty.');

  const d = mapping.distance;
  if (d) {
    out.push(`Distance from \`${d.column}\` ${unit(d.column, d.unit)}.`);
    const de = mapping.distanceError;
    if (de) out.push(`Distance error from \`${de.column}\` ${unit(de.column, de.unit)}.`);
    else out.push('No distance-error column: distance errors are left empty.');
  } else {
    out.push('No distance column: no independent distances are stored.');
  }

  if (!mapping.name) out.push('No name column: sources have no names.');
  if (options.decimalComma) {
    out.push('Numbers written with a decimal comma (30,1) are read as decimal points (30.1).');
  }
  return out;
}
