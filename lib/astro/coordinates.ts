/**
 * Sky coordinates: equatorial (ICRS / FK5 J2000, the same to well under an arcsecond here) ↔
 * Galactic (IAU 1958 system in its J2000 realisation), reading RA/Dec text, great-circle
 * separations and position angles. All angles in degrees.
 */

import { wrap360Deg } from './angles';

const DEG = Math.PI / 180;

/** J2000 right ascension of the north Galactic pole, deg (Hipparcos Catalogue, ESA 1997, Vol. 1, §1.5.3). */
export const NGP_RA_DEG = 192.85948;
/** J2000 declination of the north Galactic pole, deg (Hipparcos Catalogue, ESA 1997, Vol. 1, §1.5.3). */
export const NGP_DEC_DEG = 27.12825;
/** Galactic longitude of the north celestial pole, deg (Hipparcos Catalogue, ESA 1997, Vol. 1, §1.5.3). */
export const NCP_L_DEG = 122.93192;

/** Rows of the rotation taking equatorial unit vectors to Galactic ones (row-major 3×3). */
const EQ_TO_GAL: Float64Array = (() => {
  const sa = Math.sin(NGP_RA_DEG * DEG);
  const ca = Math.cos(NGP_RA_DEG * DEG);
  const sd = Math.sin(NGP_DEC_DEG * DEG);
  const cd = Math.cos(NGP_DEC_DEG * DEG);
  const st = Math.sin(NCP_L_DEG * DEG);
  const ct = Math.cos(NCP_L_DEG * DEG);
  // Axes of the standard spherical-trigonometry formulas: x' toward (θ − l) = 0, y' toward 90°.
  const xp = [-sd * ca, -sd * sa, cd];
  const yp = [-sa, ca, 0];
  const z = [cd * ca, cd * sa, sd];
  const m = new Float64Array(9);
  for (let j = 0; j < 3; j++) {
    m[j] = ct * xp[j] + st * yp[j];
    m[3 + j] = st * xp[j] - ct * yp[j];
    m[6 + j] = z[j];
  }
  return m;
})();

/** The equatorial (J2000) → Galactic rotation matrix, row-major, as a fresh copy. */
export function equatorialToGalacticMatrix(): number[][] {
  const m = EQ_TO_GAL;
  return [
    [m[0], m[1], m[2]],
    [m[3], m[4], m[5]],
    [m[6], m[7], m[8]],
  ];
}

function rotate(
  lonDeg: number,
  latDeg: number,
  inverse: boolean,
): { lonDeg: number; latDeg: number } {
  const cb = Math.cos(latDeg * DEG);
  const vx = cb * Math.cos(lonDeg * DEG);
  const vy = cb * Math.sin(lonDeg * DEG);
  const vz = Math.sin(latDeg * DEG);
  const m = EQ_TO_GAL;
  let gx: number, gy: number, gz: number;
  if (inverse) {
    gx = m[0] * vx + m[3] * vy + m[6] * vz;
    gy = m[1] * vx + m[4] * vy + m[7] * vz;
    gz = m[2] * vx + m[5] * vy + m[8] * vz;
  } else {
    gx = m[0] * vx + m[1] * vy + m[2] * vz;
    gy = m[3] * vx + m[4] * vy + m[5] * vz;
    gz = m[6] * vx + m[7] * vy + m[8] * vz;
  }
  return {
    lonDeg: wrap360Deg(Math.atan2(gy, gx) / DEG),
    latDeg: Math.atan2(gz, Math.hypot(gx, gy)) / DEG,
  };
}

/**
 * Galactic longitude l (deg, in [0, 360)) and latitude b (deg) of a J2000 equatorial position
 * (RA and Dec in deg), with the Hipparcos J2000 pole constants.
 */
export function equatorialToGalactic(
  raDeg: number,
  decDeg: number,
): { lDeg: number; bDeg: number } {
  const r = rotate(raDeg, decDeg, false);
  return { lDeg: r.lonDeg, bDeg: r.latDeg };
}

/** J2000 RA (deg, in [0, 360)) and Dec (deg) of a Galactic position (l, b in deg); inverse of {@link equatorialToGalactic}. */
export function galacticToEquatorial(
  lDeg: number,
  bDeg: number,
): { raDeg: number; decDeg: number } {
  const r = rotate(lDeg, bDeg, true);
  return { raDeg: r.lonDeg, decDeg: r.latDeg };
}

/**
 * Column-wise version of {@link equatorialToGalactic} for many sources: RA and Dec arrays (deg)
 * in, l (in [0, 360)) and b arrays (deg) out.
 */
export function equatorialToGalacticBulk(
  raDeg: Float64Array,
  decDeg: Float64Array,
): { lDeg: Float64Array; bDeg: Float64Array } {
  const n = raDeg.length;
  const lDeg = new Float64Array(n);
  const bDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = rotate(raDeg[i], decDeg[i], false);
    lDeg[i] = r.lonDeg;
    bDeg[i] = r.latDeg;
  }
  return { lDeg, bDeg };
}

/** Column-wise version of {@link galacticToEquatorial}: l and b arrays (deg) in, RA and Dec arrays (deg) out. */
export function galacticToEquatorialBulk(
  lDeg: Float64Array,
  bDeg: Float64Array,
): { raDeg: Float64Array; decDeg: Float64Array } {
  const n = lDeg.length;
  const raDeg = new Float64Array(n);
  const decDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = rotate(lDeg[i], bDeg[i], true);
    raDeg[i] = r.lonDeg;
    decDeg[i] = r.latDeg;
  }
  return { raDeg, decDeg };
}

/** Thrown for unreadable or out-of-range coordinate text; the message names the field and the offending value. */
export class CoordinateParseError extends Error {
  readonly value: string;
  readonly field: string;
  constructor(field: string, value: string | number, why: string) {
    const shown = typeof value === 'number' ? String(value) : JSON.stringify(value);
    super(`Cannot read ${field} ${shown}: ${why}`);
    this.name = 'CoordinateParseError';
    this.field = field;
    this.value = String(value);
  }
}

type ParsedAngle = {
  negative: boolean;
  value: number;
  unit: 'hours' | 'deg' | null;
  sexagesimal: boolean;
};

const DECIMAL = /^(\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?\s*(h|d|deg|°)?$/;
const SEXAGESIMAL =
  /^(\d+)\s*(h|d|°|:|\s)\s*(\d+(?:\.\d*)?)\s*(?:(m|′|'|:|\s)\s*(\d+(?:\.\d*)?)\s*(s|″|")?|(m|′|'))?$/;

function normalise(text: string): string {
  return text
    .trim()
    .toLowerCase()
    .replace(/[\u2212\u2010-\u2015\ufe63\uff0d]/g, '-')
    .replace(/\uff0b/g, '+')
    .replace(/º/g, '°')
    .replace(/′′|''/g, '″')
    .replace(/\s+/g, ' ');
}

function parseAngleText(field: string, text: string): ParsedAngle {
  const s = normalise(text);
  if (s === '') throw new CoordinateParseError(field, text, 'the value is empty');
  const negative = s.startsWith('-');
  const body = s.replace(/^[+-]\s*/, '');
  const dec = DECIMAL.exec(body);
  if (dec) {
    const unitText = dec[2];
    const unit = unitText === 'h' ? 'hours' : unitText ? 'deg' : null;
    const num = Number(body.slice(0, body.length - (unitText?.length ?? 0)).trim());
    if (!Number.isFinite(num)) throw new CoordinateParseError(field, text, 'not a number');
    return { negative, value: num, unit, sexagesimal: false };
  }
  const sex = SEXAGESIMAL.exec(body);
  if (!sex) {
    throw new CoordinateParseError(
      field,
      text,
      'expected decimal degrees, decimal hours or sexagesimal (e.g. 18:03:40.2, 18h03m40.2s, -24 22 43)',
    );
  }
  const whole = Number(sex[1]);
  const minutesText = sex[3];
  const secondsText = sex[5];
  if (secondsText !== undefined && minutesText.includes('.')) {
    throw new CoordinateParseError(field, text, 'minutes must be whole when seconds follow');
  }
  const minutes = Number(minutesText);
  const seconds = secondsText === undefined ? 0 : Number(secondsText);
  if (minutes >= 60) throw new CoordinateParseError(field, text, `minutes ${minutesText} ≥ 60`);
  if (seconds >= 60) throw new CoordinateParseError(field, text, `seconds ${secondsText} ≥ 60`);
  const sep = sex[2];
  const unit = sep === 'h' ? 'hours' : sep === 'd' || sep === '°' ? 'deg' : null;
  return { negative, value: whole + minutes / 60 + seconds / 3600, unit, sexagesimal: true };
}

/**
 * Right ascension in degrees, [0, 360), from a number or text. Text may be decimal degrees
 * (`270.917`, `270.917d`, `270.917°`), decimal hours (`18.0612h`) or sexagesimal hours with any
 * common separators (`18:03:40.2`, `18h03m40.2s`, `18 03 40.2`); sexagesimal with `d`/`°` is
 * read as degrees. `unit` decides unmarked values: 'deg', 'hours', or 'auto' (default:
 * unmarked decimals are degrees, unmarked sexagesimal is hours). Throws
 * {@link CoordinateParseError} for garbage, negative values, hours ≥ 24, degrees ≥ 360 and
 * minutes or seconds ≥ 60.
 */
export function parseRaDeg(text: string | number, unit: 'deg' | 'hours' | 'auto' = 'auto'): number {
  const field = 'right ascension';
  let parsed: ParsedAngle;
  if (typeof text === 'number') {
    if (!Number.isFinite(text)) throw new CoordinateParseError(field, text, 'not a finite number');
    parsed = { negative: text < 0, value: Math.abs(text), unit: null, sexagesimal: false };
  } else {
    parsed = parseAngleText(field, text);
  }
  if (parsed.negative && parsed.value !== 0) {
    throw new CoordinateParseError(field, text, 'right ascension cannot be negative');
  }
  const inHours =
    parsed.unit === 'hours' ||
    (parsed.unit === null && (unit === 'hours' || (unit === 'auto' && parsed.sexagesimal)));
  if (inHours) {
    if (parsed.value >= 24) throw new CoordinateParseError(field, text, 'hours must be below 24');
    return parsed.value * 15;
  }
  if (parsed.value >= 360) throw new CoordinateParseError(field, text, 'degrees must be below 360');
  return parsed.value;
}

/**
 * Declination in degrees, [−90, 90], from a number or text: decimal degrees or sexagesimal
 * degrees with any common separators (`-24:22:43`, `-24d22m43s`, `−24°22′43″` with the Unicode
 * minus and primes, `-00 30 00`, where the sign applies to the whole angle). Throws
 * {@link CoordinateParseError} for garbage, hour markers, |Dec| > 90 and minutes or seconds ≥ 60.
 */
export function parseDecDeg(text: string | number): number {
  const field = 'declination';
  let parsed: ParsedAngle;
  if (typeof text === 'number') {
    if (!Number.isFinite(text)) throw new CoordinateParseError(field, text, 'not a finite number');
    parsed = { negative: text < 0, value: Math.abs(text), unit: null, sexagesimal: false };
  } else {
    parsed = parseAngleText(field, text);
  }
  if (parsed.unit === 'hours') {
    throw new CoordinateParseError(field, text, 'declination cannot be given in hours');
  }
  if (parsed.value > 90) throw new CoordinateParseError(field, text, '|declination| exceeds 90°');
  return parsed.negative ? -parsed.value : parsed.value;
}

/**
 * Sexagesimal text for an angle in degrees: `HH:MM:SS.ss` when `hours` is true (the angle is
 * divided by 15), else `±DD:MM:SS.s`. Rounds once at the last shown digit so that 59.999…
 * seconds carry into the minutes.
 */
export function formatSexagesimal(
  angleDeg: number,
  options: { hours?: boolean; secondsDecimals?: number; separator?: string } = {},
): string {
  const hours = options.hours ?? false;
  const decimals = options.secondsDecimals ?? (hours ? 2 : 1);
  const sep = options.separator ?? ':';
  const scale = 10 ** decimals;
  const total = Math.round((Math.abs(angleDeg) / (hours ? 15 : 1)) * 3600 * scale);
  const whole = Math.floor(total / (3600 * scale));
  const minutes = Math.floor((total - whole * 3600 * scale) / (60 * scale));
  const seconds = (total - whole * 3600 * scale - minutes * 60 * scale) / scale;
  const secText = seconds.toFixed(decimals).padStart(decimals > 0 ? 3 + decimals : 2, '0');
  const sign = hours ? '' : angleDeg < 0 || Object.is(angleDeg, -0) ? '-' : '+';
  return `${sign}${String(whole).padStart(2, '0')}${sep}${String(minutes).padStart(2, '0')}${sep}${secText}`;
}

/**
 * Great-circle separation (deg) between two points given as longitude/latitude pairs in degrees
 * (RA/Dec or l/b), with the Vincenty form of the haversine, stable from 0° to 180°.
 */
export function angularSeparationDeg(
  lon1Deg: number,
  lat1Deg: number,
  lon2Deg: number,
  lat2Deg: number,
): number {
  const dLon = (lon2Deg - lon1Deg) * DEG;
  const s1 = Math.sin(lat1Deg * DEG);
  const c1 = Math.cos(lat1Deg * DEG);
  const s2 = Math.sin(lat2Deg * DEG);
  const c2 = Math.cos(lat2Deg * DEG);
  const sd = Math.sin(dLon);
  const cd = Math.cos(dLon);
  const num = Math.hypot(c2 * sd, c1 * s2 - s1 * c2 * cd);
  return Math.atan2(num, s1 * s2 + c1 * c2 * cd) / DEG;
}

/**
 * Position angle (deg, [0, 360)) of point 2 as seen from point 1, measured from the direction of
 * increasing latitude (north) toward increasing longitude (east). Inputs in degrees.
 */
export function positionAngleDeg(
  lon1Deg: number,
  lat1Deg: number,
  lon2Deg: number,
  lat2Deg: number,
): number {
  const dLon = (lon2Deg - lon1Deg) * DEG;
  const c2 = Math.cos(lat2Deg * DEG);
  const y = Math.sin(dLon) * c2;
  const x =
    Math.cos(lat1Deg * DEG) * Math.sin(lat2Deg * DEG) -
    Math.sin(lat1Deg * DEG) * c2 * Math.cos(dLon);
  return wrap360Deg(Math.atan2(y, x) / DEG);
}
