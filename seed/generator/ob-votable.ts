/**
 * The OB-association catalog as a VOTable 1.4 document (TABLEDATA), written by
 * `@/lib/export/votable`: ICRS positions in decimal degrees, LSR velocities, independent
 * distances with errors and the method that gave them, angular diameters; every field with unit,
 * UCD and description.
 */
import { votableStream, type VotableField } from '@/lib/export/votable';
import { DIST_METHOD, type TracerCatalog } from './catalog';
import { distMethodCode, equatorialOf, sourceName } from './layouts';
import { batchChunks } from './text-file';

/** File name of the OB VOTable. */
export const OB_FILE_NAME = 'hrg-ob-associations.vot';

/** The fields of the OB table, in column order. */
export const OB_FIELDS: VotableField[] = [
  { name: 'assoc', datatype: 'char', ucd: 'meta.id;meta.main', description: 'OB association name' },
  {
    name: 'ra',
    datatype: 'double',
    unit: 'deg',
    ucd: 'pos.eq.ra;meta.main',
    description: 'Right ascension, ICRS (J2000)',
  },
  {
    name: 'dec',
    datatype: 'double',
    unit: 'deg',
    ucd: 'pos.eq.dec;meta.main',
    description: 'Declination, ICRS (J2000)',
  },
  {
    name: 'vlsr',
    datatype: 'double',
    unit: 'km/s',
    ucd: 'spect.dopplerVeloc;pos.lsr',
    description: 'Mean radial velocity of the members relative to the kinematic LSR',
  },
  {
    name: 'vlsr_err',
    datatype: 'double',
    unit: 'km/s',
    ucd: 'stat.error;spect.dopplerVeloc',
    description: '1-sigma error of vlsr',
  },
  {
    name: 'dist',
    datatype: 'double',
    unit: 'kpc',
    ucd: 'pos.distance',
    description: 'Independent distance (parallax or photometric); empty when none',
  },
  {
    name: 'dist_err',
    datatype: 'double',
    unit: 'kpc',
    ucd: 'stat.error;pos.distance',
    description: '1-sigma error of dist',
  },
  {
    name: 'dist_method',
    datatype: 'char',
    ucd: 'meta.code',
    description: 'plx = mean parallax, phot = photometric; empty when no distance',
  },
  {
    name: 'diam',
    datatype: 'double',
    unit: 'arcmin',
    ucd: 'phys.angSize',
    description: 'Angular diameter of the association',
  },
];

/** `value` rounded to `digits` decimals, NaN kept (written as an empty cell). */
function round(value: number, digits: number): number {
  return Number.isFinite(value) ? Number(value.toFixed(digits)) : NaN;
}

/** Table cells of row i in {@link OB_FIELDS} order. */
export function obRowCells(cat: TracerCatalog, i: number): (string | number)[] {
  const { raDeg, decDeg } = equatorialOf(cat, i);
  const hasDist = cat.distMethod[i] !== DIST_METHOD.none;
  return [
    sourceName('OB', i, cat.count),
    round(raDeg, 6),
    round(decDeg, 6),
    round(cat.vLsrKms[i], 2),
    round(cat.vErrKms[i], 2),
    hasDist ? round(cat.indepDistKpc[i], 3) : NaN,
    hasDist ? round(cat.indepDistErrKpc[i], 3) : NaN,
    distMethodCode(cat.distMethod[i]),
    round(cat.sizeArcmin[i], 3),
  ];
}

function* rowsOf(cat: TracerCatalog): Generator<(string | number)[]> {
  for (let i = 0; i < cat.count; i++) yield obRowCells(cat, i);
}

/** The VOTable document for the OB catalog, as text chunks of many rows each. */
export function obVotableChunks(cat: TracerCatalog): AsyncIterable<string> {
  return batchChunks(
    votableStream({
      resourceName: 'HRG-OB',
      tableName: 'ob_associations',
      description:
        'Harbor Ridge Radio Group - OB associations of the synthetic demo galaxy (invented data). Positions ICRS; velocities relative to the kinematic LSR.',
      fields: OB_FIELDS,
      rows: rowsOf(cat),
    }),
  );
}
