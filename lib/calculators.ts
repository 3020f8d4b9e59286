/**
 * The calculators: coordinate conversion (J2000 / ICRS ↔ Galactic) and kinematic distances for
 * lists of positions, shared by `POST /api/tools/*` and the calculators page. Request checking
 * lives here so that every caller gets the same limits and the same messages, each naming the
 * offending entry by its index. This module touches no database, so the page may also use its
 * curve builder and its paste reader in the browser.
 */
import { z } from 'zod';
import {
  CoordinateParseError,
  equatorialToGalacticBulk,
  galacticToEquatorialBulk,
  parseDecDeg,
  parseRaDeg,
} from '@/lib/astro/coordinates';
import {
  DEFAULT_VELOCITY_SIGMA_KMS,
  flagsFromBits,
  KINEMATIC_FLAG_BITS,
  kinematicDistancesBulk,
  kinematicIntervalsBulk,
  UNRELIABLE_LONGITUDE_DEG,
  type KinematicFlag,
} from '@/lib/astro/kinematic-distance';
import {
  makeRotationCurve,
  ROTATION_CURVE_PRESETS,
  type RotationCurve,
} from '@/lib/astro/rotation-curves';
import { HttpError } from '@/lib/http/errors';

/** Most points (or sources) one calculator request may carry; more is a 413. */
export const MAX_TOOL_POINTS = 100_000;

/** Frames a position list can be given in. */
export const COORDINATE_FRAMES = ['equatorial', 'galactic'] as const;
export type CoordinateFrame = (typeof COORDINATE_FRAMES)[number];

/** Rotation curves the kinematic-distance calculator offers (the named published models). */
export const TOOL_CURVES = ['flat', 'brand-blitz-1993', 'reid-2014', 'reid-2019'] as const;
export type ToolCurveName = (typeof TOOL_CURVES)[number];

/**
 * Θ0 of a preset as a form shows it: to 0.1 km/s, the precision the papers quote (Reid et al.
 * 2014's Θ(R0) = 240.9987 km/s is shown as 241). Entering this value reproduces the published
 * curve exactly (see {@link toolCurve}).
 */
const shownTheta0 = (theta0Kms: number) => Number(theta0Kms.toFixed(1));

/** Presets of {@link TOOL_CURVES} (label, source, default R0 and Θ0 as shown, published 1σ of R0 and Θ0) for forms. */
export const TOOL_CURVE_PRESETS = ROTATION_CURVE_PRESETS.filter((p) =>
  (TOOL_CURVES as readonly string[]).includes(p.name),
).map((p) => ({
  name: p.name as ToolCurveName,
  label: p.label,
  source: p.source,
  R0Kpc: p.R0Kpc,
  theta0Kms: shownTheta0(p.theta0Kms as number),
  R0ErrKpc: p.R0ErrKpc,
  theta0ErrKms: p.theta0ErrKms,
}));
export type ToolCurvePreset = (typeof TOOL_CURVE_PRESETS)[number];

/** One plain sentence per kinematic-distance flag, for tables and tooltips. */
export const KINEMATIC_FLAG_TEXT: Readonly<Record<KinematicFlag, string>> = Object.freeze({
  'beyond-terminal':
    'The velocity exceeds the terminal velocity of this sight line; the source is placed at the tangent point.',
  'near-tangent': `Near and far lie so close to the tangent point that the source's velocity uncertainty (${DEFAULT_VELOCITY_SIGMA_KMS} km/s of typical streaming unless given) cannot tell them apart.`,
  'unreliable-longitude': `Within ${UNRELIABLE_LONGITUDE_DEG}° of l = 0° or 180°: the velocity hardly changes with distance here and non-circular motions dominate.`,
  'outer-galaxy':
    'Outside the solar circle (R > R0): there is a single root, given in the single column (near and far are empty).',
  'no-solution':
    'No point on this sight line has this velocity under circular rotation (a forbidden velocity, or a direction where velocity does not depend on distance).',
});

/** Most bad entries or pasted lines one error lists; the rest are counted. */
export const MAX_REPORTED_PROBLEMS = 50;

/**
 * A 400 that names every offending entry, first first, e.g.
 * `points[17]: latitude 95 is outside −90…90° (and 3 more bad points)`; `details` lists up to
 * {@link MAX_REPORTED_PROBLEMS} of them with their index.
 */
function entriesError(list: string, problems: { index: number; reason: string }[]): HttpError {
  const [first] = problems;
  const more = problems.length - 1;
  return new HttpError(
    400,
    `invalid_${list === 'points' ? 'point' : 'source'}`,
    `${list}[${first.index}]: ${first.reason}${more > 0 ? ` (and ${more} more bad ${list})` : ''}`,
    problems
      .slice(0, MAX_REPORTED_PROBLEMS)
      .map(({ index, reason }) => ({ path: `${list}[${index}]`, index, message: reason })),
  );
}

function tooMany(list: string, n: number): HttpError {
  return new HttpError(
    413,
    'too_many_points',
    `${n} ${list} in one request; the limit is ${MAX_TOOL_POINTS}. Split the list into several requests.`,
    { count: n, limit: MAX_TOOL_POINTS },
  );
}

function shown(value: unknown): string {
  return typeof value === 'string' ? JSON.stringify(value) : String(value);
}

/** Body of `POST /api/tools/convert`: the envelope; each point is checked by {@link convertPoints}. */
export const convertRequestSchema = z.object({
  from: z.enum(COORDINATE_FRAMES),
  points: z.array(z.unknown()),
});
export type ConvertRequest = z.infer<typeof convertRequestSchema>;

function readNumber(value: unknown, what: string): number {
  const n = typeof value === 'string' && value.trim() !== '' ? Number(value) : value;
  if (typeof n !== 'number' || !Number.isFinite(n)) {
    throw new RangeError(`${what} ${shown(value)} is not a finite number`);
  }
  return n;
}

function readEquatorial(point: unknown[]): [number, number] {
  const [ra, dec] = point;
  if (typeof ra === 'number' && !(ra >= 0 && ra < 360)) {
    throw new RangeError(`right ascension ${ra} is outside 0…360°`);
  }
  if (typeof dec === 'number' && !(dec >= -90 && dec <= 90)) {
    throw new RangeError(`declination ${dec} is outside −90…90°`);
  }
  if (typeof ra !== 'number' && typeof ra !== 'string') {
    throw new RangeError(`right ascension ${shown(ra)} is neither a number nor text`);
  }
  if (typeof dec !== 'number' && typeof dec !== 'string') {
    throw new RangeError(`declination ${shown(dec)} is neither a number nor text`);
  }
  return [parseRaDeg(ra), parseDecDeg(dec)];
}

function readGalactic(point: unknown[]): [number, number] {
  const l = readNumber(point[0], 'longitude l');
  const b = readNumber(point[1], 'latitude b');
  if (l < -360 || l > 360) throw new RangeError(`longitude l ${l} is outside −360…360°`);
  if (b < -90 || b > 90) throw new RangeError(`latitude b ${b} is outside −90…90°`);
  return [l, b];
}

/**
 * Converts a checked request: equatorial (J2000 / ICRS RA, Dec in degrees, or RA/Dec text such
 * as `18:03:40.2` / `-24 22 43` read by parseRaDeg/parseDecDeg) to Galactic (l in [0, 360), b),
 * or Galactic (l, b in degrees, numbers or decimal text) to equatorial (RA in [0, 360), Dec).
 * Throws a 413 beyond {@link MAX_TOOL_POINTS} and a 400 naming every bad point's index.
 */
export function convertPoints(input: ConvertRequest): { points: Array<[number, number]> } {
  const n = input.points.length;
  if (n > MAX_TOOL_POINTS) throw tooMany('points', n);
  const lon = new Float64Array(n);
  const lat = new Float64Array(n);
  const read = input.from === 'equatorial' ? readEquatorial : readGalactic;
  const problems: { index: number; reason: string }[] = [];
  for (let i = 0; i < n; i++) {
    const p = input.points[i];
    if (!Array.isArray(p) || p.length !== 2) {
      problems.push({
        index: i,
        reason: `expected a [longitude, latitude] pair, got ${JSON.stringify(p)}`,
      });
      continue;
    }
    try {
      [lon[i], lat[i]] = read(p);
    } catch (e) {
      if (!(e instanceof RangeError || e instanceof CoordinateParseError)) throw e;
      problems.push({ index: i, reason: e.message });
    }
  }
  if (problems.length > 0) throw entriesError('points', problems);
  let outLon: Float64Array;
  let outLat: Float64Array;
  if (input.from === 'equatorial') {
    ({ lDeg: outLon, bDeg: outLat } = equatorialToGalacticBulk(lon, lat));
  } else {
    ({ raDeg: outLon, decDeg: outLat } = galacticToEquatorialBulk(lon, lat));
  }
  const points = new Array<[number, number]>(n);
  for (let i = 0; i < n; i++) points[i] = [outLon[i], outLat[i]];
  return { points };
}

/** Body of `POST /api/tools/kinematic-distance`: the envelope; each source is checked by {@link kinematicDistances}. */
export const kinematicDistanceRequestSchema = z.object({
  curve: z.enum(TOOL_CURVES),
  R0: z.number().positive().max(100).optional(),
  theta0: z.number().positive().max(1000).optional(),
  sources: z.array(z.unknown()),
});
export type KinematicDistanceRequest = z.infer<typeof kinematicDistanceRequestSchema>;

/** Most sources that get Monte Carlo intervals in one request; larger lists get the roots alone. */
export const MAX_INTERVAL_SOURCES = 10_000;

/** Monte Carlo draws per source for the intervals (16th and 84th percentiles good to about 0.15σ). */
export const INTERVAL_DRAWS = 100;

/**
 * The rotation curve of a calculator request. `R0Kpc` (kpc) replaces the model's Sun–centre
 * distance; `theta0Kms` (km/s) replaces the Θ0 of the v_LSR formula (the model's own Θ0 for the
 * flat, Brand & Blitz and Clemens curves; Θ(R0) of the universal curves, which are rescaled to
 * it). A preset's Θ0 as a form shows it (to 0.1 km/s) with the preset's R0 stands for the
 * published curve itself, so that what is shown reproduces it. Throws a 400 for constants the
 * model rejects.
 */
export function toolCurve(name: ToolCurveName, R0Kpc?: number, theta0Kms?: number): RotationCurve {
  const preset = TOOL_CURVE_PRESETS.find((p) => p.name === name);
  const asPublished =
    preset !== undefined &&
    theta0Kms === preset.theta0Kms &&
    (R0Kpc === undefined || R0Kpc === preset.R0Kpc);
  try {
    return makeRotationCurve(name, { R0Kpc, theta0Kms: asPublished ? undefined : theta0Kms });
  } catch (e) {
    if (e instanceof RangeError) throw new HttpError(400, 'invalid_curve', e.message);
    throw e;
  }
}

/** A 68 % interval (16th–84th percentile of the Monte Carlo draws), kpc. */
export type KpcInterval = [number, number];

/**
 * One kinematic-distance result as the API returns it: kpc, null where a root does not exist.
 * Inside the solar circle `near` and `far`; outside it (flag 'outer-galaxy') `single`, with
 * `near` and `far` null. `intervals` holds the 68 % interval of each root the source has (null
 * for the others), or is null when the request was too large for Monte Carlo.
 */
export type KinematicDistanceRow = {
  R: number | null;
  near: number | null;
  far: number | null;
  single: number | null;
  tangent: number | null;
  flags: KinematicFlag[];
  intervals: {
    near: KpcInterval | null;
    far: KpcInterval | null;
    single: KpcInterval | null;
  } | null;
};

/**
 * The curve actually used, echoed with the results: R0 (kpc) and Θ0 (km/s) as entered (or the
 * preset's as shown), and the 1σ of R0 and Θ0 the intervals drew from (null where the preset's
 * constants are adopted standards without an uncertainty).
 */
export type ToolCurveUsed = {
  name: ToolCurveName;
  label: string;
  source: string;
  R0: number;
  theta0: number;
  R0Err: number | null;
  theta0Err: number | null;
};

/** How the intervals were made, echoed with the results; `draws` is 0 when they were left out. */
export type IntervalMethod = {
  draws: number;
  defaultVelocityErrKms: number;
  constantsDrawn: boolean;
  note: string;
};

function readSource(s: unknown): [number, number, number, number] {
  if (typeof s !== 'object' || s === null || Array.isArray(s)) {
    throw new RangeError(
      `expected an object { l, b, v } (vErr optional), got ${JSON.stringify(s)}`,
    );
  }
  const { l, b, v, vErr } = s as Record<string, unknown>;
  for (const [key, value] of [
    ['l', l],
    ['b', b],
    ['v', v],
  ] as const) {
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new RangeError(
        `${key} ${value === undefined ? 'is missing' : `${shown(value)} is not a finite number`}`,
      );
    }
  }
  const [ln, bn, vn] = [l, b, v] as [number, number, number];
  if (ln < -360 || ln > 360) throw new RangeError(`longitude l ${ln} is outside −360…360°`);
  if (bn < -90 || bn > 90) throw new RangeError(`latitude b ${bn} is outside −90…90°`);
  if (vErr === undefined || vErr === null) return [ln, bn, vn, DEFAULT_VELOCITY_SIGMA_KMS];
  if (typeof vErr !== 'number' || !(vErr > 0) || !Number.isFinite(vErr)) {
    throw new RangeError(
      `velocity uncertainty vErr ${shown(vErr)} must be a positive number (km/s)`,
    );
  }
  return [ln, bn, vn, vErr];
}

const nullable = (x: number): number | null => (Number.isNaN(x) ? null : x);

/**
 * Kinematic distances (docs/methods.md, "Kinematic distances") of a checked request: sources at
 * Galactic l, b (deg) with v_LSR (km/s) and an optional 1σ velocity uncertainty `vErr` (km/s,
 * measurement and streaming together; {@link DEFAULT_VELOCITY_SIGMA_KMS} of streaming when left
 * out), on the chosen curve with optional R0 (kpc) and Θ0 (km/s). Roots follow
 * `kinematicDistancesBulk` (line-of-sight kpc) with the outer-Galaxy root moved to `single`.
 * Up to {@link MAX_INTERVAL_SOURCES} sources also get 68 % Monte Carlo intervals from
 * {@link INTERVAL_DRAWS} draws over the velocity and the curve's published R0 and Θ0 errors
 * (`kinematicIntervalsBulk`, seed 1, so the same request gives the same intervals). Throws a 413
 * beyond {@link MAX_TOOL_POINTS} sources and a 400 naming every bad source's index.
 */
export function kinematicDistances(input: KinematicDistanceRequest): {
  curve: ToolCurveUsed;
  intervals: IntervalMethod;
  results: KinematicDistanceRow[];
} {
  const n = input.sources.length;
  if (n > MAX_TOOL_POINTS) throw tooMany('sources', n);
  const lDeg = new Float64Array(n);
  const bDeg = new Float64Array(n);
  const vKms = new Float64Array(n);
  const vErrKms = new Float64Array(n);
  const problems: { index: number; reason: string }[] = [];
  for (let i = 0; i < n; i++) {
    try {
      [lDeg[i], bDeg[i], vKms[i], vErrKms[i]] = readSource(input.sources[i]);
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      problems.push({ index: i, reason: e.message });
    }
  }
  if (problems.length > 0) throw entriesError('sources', problems);
  const curve = toolCurve(input.curve, input.R0, input.theta0);
  const out = kinematicDistancesBulk(lDeg, bDeg, vKms, curve, vErrKms);
  const mc =
    n <= MAX_INTERVAL_SOURCES
      ? kinematicIntervalsBulk(lDeg, bDeg, vKms, vErrKms, curve, { draws: INTERVAL_DRAWS })
      : null;
  const range = (cols: { loKpc: Float64Array; hiKpc: Float64Array }, i: number, has: boolean) =>
    has && cols.loKpc[i] === cols.loKpc[i] ? ([cols.loKpc[i], cols.hiKpc[i]] as KpcInterval) : null;
  const results = new Array<KinematicDistanceRow>(n);
  for (let i = 0; i < n; i++) {
    const outer = (out.flags[i] & KINEMATIC_FLAG_BITS['outer-galaxy']) !== 0;
    const near = outer ? null : nullable(out.nearKpc[i]);
    const far = outer ? null : nullable(out.farKpc[i]);
    const single = outer ? nullable(out.farKpc[i]) : null;
    results[i] = {
      R: nullable(out.RKpc[i]),
      near,
      far,
      single,
      tangent: nullable(out.tangentKpc[i]),
      flags: flagsFromBits(out.flags[i]),
      intervals: mc && {
        near: range(mc.near, i, near !== null),
        far: range(mc.far, i, far !== null),
        single: range(mc.single, i, single !== null),
      },
    };
  }
  const preset = TOOL_CURVE_PRESETS.find((p) => p.name === input.curve);
  return {
    curve: {
      name: input.curve,
      label: curve.label,
      source: curve.source,
      R0: input.R0 ?? curve.R0Kpc,
      theta0: input.theta0 ?? preset?.theta0Kms ?? curve.theta0Kms,
      R0Err: curve.R0ErrKpc,
      theta0Err: curve.theta0ErrKms,
    },
    intervals: {
      draws: mc ? mc.draws : 0,
      defaultVelocityErrKms: DEFAULT_VELOCITY_SIGMA_KMS,
      constantsDrawn: mc ? mc.constantsDrawn : false,
      note: mc
        ? `68 % intervals (16th–84th percentiles) of ${mc.draws} Monte Carlo draws over each velocity (its vErr, else ${DEFAULT_VELOCITY_SIGMA_KMS} km/s of streaming)${mc.constantsDrawn ? ` and over R0 and Θ0 (σ = ${curve.R0ErrKpc ?? 0} kpc and ${curve.theta0ErrKms ?? 0} km/s, published with the curve)` : '; this curve publishes no uncertainty of R0 or Θ0, so they are held fixed'}.`
        : `No intervals: more than ${MAX_INTERVAL_SOURCES} sources in one request. Split the list to get them.`,
    },
    results,
  };
}

/** A pasted line split into its values, with its 1-based line number. */
export type PastedRow = { line: number; values: string[] };

/** One pasted line that cannot be used, and why. */
export type LineProblem = { line: number; reason: string };

/** Every unusable pasted line, in line order; the message lists them (see {@link linesReport}). */
export class PastedLinesError extends RangeError {
  constructor(readonly problems: LineProblem[]) {
    super(linesReport(problems));
    this.name = 'PastedLinesError';
  }
}

/**
 * The problems as lines of text, `Line 4: …`, first first, at most `cap` of them and then
 * "and N more bad lines."
 */
export function linesReport(problems: LineProblem[], cap = MAX_REPORTED_PROBLEMS): string {
  const sorted = [...problems].sort((x, y) => x.line - y.line);
  const shown = sorted.slice(0, cap).map((p) => `Line ${p.line}: ${p.reason}`);
  const more = sorted.length - shown.length;
  if (more > 0) shown.push(`and ${more} more bad line${more === 1 ? '' : 's'}.`);
  return shown.join('\n');
}

/**
 * Reads pasted text into rows of `width` values (2 for positions, 3 for l, b, v), one row per
 * line, or up to `maxWidth` values where trailing ones are optional (4 for l, b, v, σ_v). Blank
 * lines and lines starting with `#` are skipped. Values are separated by commas, semicolons or
 * tabs, or else by spaces; with spaces, a position line of six values is read as two
 * sexagesimal triples (`18 03 40.2 -24 22 43`). `check` may refuse a row's values with a reason.
 * Throws a {@link PastedLinesError} listing every line with the wrong number of values or refused
 * by `check`.
 */
export function readPastedRows(
  text: string,
  width: 2 | 3,
  maxWidth: number = width,
  check?: (values: string[]) => string | null,
): PastedRow[] {
  const rows: PastedRow[] = [];
  const problems: LineProblem[] = [];
  text.split(/\r\n|\r|\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) return;
    let values = /[,;\t]/.test(line)
      ? line.split(/\s*[,;\t]\s*/).filter((v) => v !== '')
      : line.split(/\s+/);
    if (width === 2 && values.length === 6) {
      values = [values.slice(0, 3).join(' '), values.slice(3).join(' ')];
    }
    if (values.length < width || values.length > maxWidth) {
      const wanted =
        width === 2
          ? 'two values (longitude and latitude)'
          : maxWidth > width
            ? 'three or four values (l, b, v and optionally σ_v)'
            : 'three values (l, b, v)';
      problems.push({
        line: i + 1,
        reason: `expected ${wanted}, found ${values.length} in "${line}"`,
      });
      return;
    }
    const refused = check?.(values);
    if (refused) problems.push({ line: i + 1, reason: refused });
    else rows.push({ line: i + 1, values });
  });
  if (problems.length > 0) throw new PastedLinesError(problems);
  return rows;
}
