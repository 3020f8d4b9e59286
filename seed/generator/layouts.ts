/**
 * The layouts of the demo files, one per survey of the fictional Harbor Ridge Radio Group, each
 * in the style such surveys publish in: a plain CSV in Galactic coordinates (HI), a semicolon
 * table with a `#` comment header (CO), a CSV in sexagesimal J2000 with heliocentric optical
 * velocities (HII), and a VOTable with UCDs and independent distances (OB). Each column says
 * its unit and meaning; the truth file repeats these descriptions.
 */
import { formatSexagesimal, galacticToEquatorial } from '@/lib/astro/coordinates';
import { convertVelocityConvention, lsrToHelioKms } from '@/lib/astro/velocity';
import { DIST_METHOD, type TracerCatalog } from './catalog';
import type { Tracer } from './params';

/** One column of a text file: header name, unit, meaning, and its text for row i. */
export type TextColumn = {
  name: string;
  unit: string;
  meaning: string;
  text(cat: TracerCatalog, i: number): string;
};

/** A delimited text layout. */
export type TextLayout = {
  tracer: Tracer;
  fileName: string;
  delimiter: string;
  /** Lines written before the header, each starting with '#'. */
  comments: string[];
  columns: TextColumn[];
};

/** Survey name prefixes of the demo catalogs (invented). */
export const NAME_PREFIX: Record<Tracer, string> = {
  HI: 'HRG-HI',
  CO: 'HRG-CO',
  HII: 'HRG-HII',
  OB: 'HRG-OB',
};

/** Name of row i (0-based) of a catalog of `count` rows: prefix and a zero-padded serial number. */
export function sourceName(tracer: Tracer, i: number, count: number): string {
  const width = Math.max(4, String(count).length);
  return `${NAME_PREFIX[tracer]} ${String(i + 1).padStart(width, '0')}`;
}

/** Longitude text in [0, 360) with `digits` decimals (a value that rounds to 360 is written as 0). */
function lonText(lDeg: number, digits: number): string {
  const t = lDeg.toFixed(digits);
  return Number(t) >= 360 ? (0).toFixed(digits) : t;
}

function num(value: number, digits: number): string {
  return Number.isFinite(value) ? value.toFixed(digits) : '';
}

/** RA/Dec (deg) of row i, J2000. */
export function equatorialOf(cat: TracerCatalog, i: number): { raDeg: number; decDeg: number } {
  return galacticToEquatorial(cat.lDeg[i], cat.bDeg[i]);
}

/** `HH:MM:SS.ss` for an RA in degrees (a value that rounds to 24h is written as 00:00:00.00). */
export function raText(raDeg: number): string {
  const t = formatSexagesimal(raDeg, { hours: true, secondsDecimals: 2 });
  return t.startsWith('24') ? formatSexagesimal(0, { hours: true, secondsDecimals: 2 }) : t;
}

/** `±DD:MM:SS.s` for a declination in degrees. */
export function decText(decDeg: number): string {
  return formatSexagesimal(decDeg, { secondsDecimals: 1 });
}

/**
 * Heliocentric optical-convention velocity (km/s) written for an HII region whose model
 * velocity is the radio-convention LSR velocity vLsrKms at (l, b): exact radio → optical
 * conversion, then the kinematic-LSR correction (lib/astro/velocity).
 */
export function hiiHelioOpticalKms(vLsrKms: number, lDeg: number, bDeg: number): number {
  return lsrToHelioKms(convertVelocityConvention(vLsrKms, 'radio', 'optical'), lDeg, bDeg);
}

/** HI clouds: plain CSV, Galactic coordinates, LSR radio velocities. */
export const HI_LAYOUT: TextLayout = {
  tracer: 'HI',
  fileName: 'hrg-hi-clouds.csv',
  delimiter: ',',
  comments: [],
  columns: [
    {
      name: 'GLON',
      unit: 'deg',
      meaning: 'Galactic longitude [0, 360)',
      text: (c, i) => lonText(c.lDeg[i], 5),
    },
    {
      name: 'GLAT',
      unit: 'deg',
      meaning: 'Galactic latitude',
      text: (c, i) => c.bDeg[i].toFixed(5),
    },
    {
      name: 'VLSR',
      unit: 'km/s',
      meaning: 'LSR velocity (kinematic LSR), radio convention',
      text: (c, i) => num(c.vLsrKms[i], 2),
    },
    {
      name: 'FWHM_KMS',
      unit: 'km/s',
      meaning: '21 cm line full width at half maximum',
      text: (c, i) => num(c.lineWidthKms[i], 2),
    },
    {
      name: 'SIZE_ARCMIN',
      unit: 'arcmin',
      meaning: 'angular diameter (FWHM)',
      text: (c, i) => num(c.sizeArcmin[i], 3),
    },
    { name: 'NAME', unit: '', meaning: 'cloud name', text: (c, i) => sourceName('HI', i, c.count) },
  ],
};

/** CO clouds: semicolon-separated, `#` comment header, Galactic coordinates, LSR radio velocities. */
export const CO_LAYOUT: TextLayout = {
  tracer: 'CO',
  fileName: 'hrg-co-clouds.txt',
  delimiter: ';',
  comments: [
    '# Harbor Ridge Radio Group - CO(1-0) molecular cloud list (synthetic demo data)',
    '# l_deg, b_deg: Galactic longitude and latitude (deg)',
    '# v_lsr_kms: LSR velocity (kinematic LSR, radio convention), km/s',
    '# sigma_v: 1-sigma velocity dispersion of the line, km/s',
    '# radius_arcsec: equivalent angular radius, arcsec',
    '# cloud_id: cloud designation',
  ],
  columns: [
    {
      name: 'l_deg',
      unit: 'deg',
      meaning: 'Galactic longitude [0, 360)',
      text: (c, i) => lonText(c.lDeg[i], 5),
    },
    {
      name: 'b_deg',
      unit: 'deg',
      meaning: 'Galactic latitude',
      text: (c, i) => c.bDeg[i].toFixed(5),
    },
    {
      name: 'v_lsr_kms',
      unit: 'km/s',
      meaning: 'LSR velocity (kinematic LSR), radio convention',
      text: (c, i) => num(c.vLsrKms[i], 2),
    },
    {
      name: 'sigma_v',
      unit: 'km/s',
      meaning: '1-sigma line velocity dispersion',
      text: (c, i) => num(c.lineWidthKms[i], 2),
    },
    {
      name: 'radius_arcsec',
      unit: 'arcsec',
      meaning: 'equivalent angular radius (half the diameter)',
      text: (c, i) => num(c.sizeArcmin[i] * 30, 1),
    },
    {
      name: 'cloud_id',
      unit: '',
      meaning: 'cloud name',
      text: (c, i) => sourceName('CO', i, c.count),
    },
  ],
};

/** HII regions: CSV, sexagesimal J2000, heliocentric optical-convention recombination-line velocities. */
export const HII_LAYOUT: TextLayout = {
  tracer: 'HII',
  fileName: 'hrg-hii-regions.csv',
  delimiter: ',',
  comments: [],
  columns: [
    {
      name: 'REGION',
      unit: '',
      meaning: 'HII region name',
      text: (c, i) => sourceName('HII', i, c.count),
    },
    {
      name: 'RA_J2000',
      unit: 'h:m:s',
      meaning: 'right ascension, J2000 (ICRS), sexagesimal hours',
      text: (c, i) => raText(equatorialOf(c, i).raDeg),
    },
    {
      name: 'DEC_J2000',
      unit: 'd:m:s',
      meaning: 'declination, J2000 (ICRS), sexagesimal degrees',
      text: (c, i) => decText(equatorialOf(c, i).decDeg),
    },
    {
      name: 'V_HEL_OPT',
      unit: 'km/s',
      meaning: 'heliocentric radio recombination-line velocity, optical convention',
      text: (c, i) => num(hiiHelioOpticalKms(c.vLsrKms[i], c.lDeg[i], c.bDeg[i]), 2),
    },
    {
      name: 'E_V_HEL',
      unit: 'km/s',
      meaning: '1-sigma velocity error',
      text: (c, i) => num(c.vErrKms[i], 2),
    },
    {
      name: 'RRL_FWHM',
      unit: 'km/s',
      meaning: 'recombination-line full width at half maximum',
      text: (c, i) => num(c.lineWidthKms[i], 1),
    },
    {
      name: 'DIAM_ARCMIN',
      unit: 'arcmin',
      meaning: 'angular diameter',
      text: (c, i) => num(c.sizeArcmin[i], 3),
    },
  ],
};

/** The text layouts by tracer (OB is a VOTable, see ob-votable.ts). */
export const TEXT_LAYOUTS = [HI_LAYOUT, CO_LAYOUT, HII_LAYOUT] as const;

/** Code written for a distance method in the OB VOTable ('' when there is no distance). */
export function distMethodCode(method: number): string {
  return method === DIST_METHOD.parallax ? 'plx' : method === DIST_METHOD.photometric ? 'phot' : '';
}
