import { isMissingCell, isSexagesimalCell, parseNumberCell } from './cells';
import { IngestFileError } from './errors';
import { mappingSchema, type Mapping } from './mapping';
import type { ColumnInfo, TableHeader } from './types';
import { parseUnit, type ParsedUnit } from './units';

/** One way of reading the position from two columns, with the evidence behind it. */
export interface PositionCandidate {
  system: 'galactic' | 'equatorial';
  lon: Mapping['position']['lon'];
  lat: Mapping['position']['lat'];
  /** `ucd` (VOTable UCDs), `name` (header names) or `values` (only the numbers/text fit). */
  evidence: 'ucd' | 'name' | 'values';
}

/** A column whose unit could not be read, or a header that cannot be mapped at all. */
export interface MappingProblem {
  code: 'unknown-unit' | 'wrong-delimiter';
  column: string;
  unit?: string;
  message: string;
}

/**
 * The result of {@link suggestMapping}. `mapping` is complete (valid for {@link mappingSchema})
 * when the position columns are unambiguous and every chosen column's unit is known; otherwise
 * it is `null` and `candidates` / `problems` say why. `notes` lists the assumptions made (e.g.
 * "velocity frame assumed LSR") for the mapping screen to show.
 */
export interface MappingSuggestion {
  mapping: Mapping | null;
  positionUnambiguous: boolean;
  candidates: PositionCandidate[];
  problems: MappingProblem[];
  notes: string[];
  /** The optional fields found, even when the position is unresolved. */
  fields: Omit<Mapping, 'position'>;
}

type Role =
  | 'glon'
  | 'glat'
  | 'ra'
  | 'dec'
  | 'velocity'
  | 'size'
  | 'positionError'
  | 'velocityError'
  | 'lineWidth'
  | 'distance'
  | 'distanceError'
  | 'name';

interface ColumnFacts {
  index: number;
  name: string;
  key: string;
  unitText: string | null;
  unit: ParsedUnit | null;
  ucd: string[];
  samples: string[];
  numeric: boolean;
  sexagesimal: boolean;
  min: number;
  max: number;
}

const NAME_KEYS: Record<Exclude<Role, 'velocityError' | 'distanceError'>, string[]> = {
  glon: [
    'l',
    'glon',
    'lon',
    'lii',
    'galon',
    'glong',
    'gallon',
    'gallong',
    'lgal',
    'ell',
    'longitude',
    'galacticlongitude',
  ],
  glat: ['b', 'glat', 'lat', 'bii', 'galat', 'gallat', 'bgal', 'latitude', 'galacticlatitude'],
  ra: [
    'ra',
    'raj2000',
    'ra2000',
    'raicrs',
    'radeg',
    'rah',
    'alpha',
    'alphaj2000',
    'rightascension',
  ],
  dec: [
    'dec',
    'de',
    'dej2000',
    'decj2000',
    'dec2000',
    'deicrs',
    'decicrs',
    'decdeg',
    'delta',
    'deltaj2000',
    'declination',
  ],
  velocity: [
    'v',
    'vlsr',
    'vlsrk',
    'vel',
    'velocity',
    'vrad',
    'vr',
    'rv',
    'radvel',
    'radialvelocity',
    'vhel',
    'vhelio',
    'vbary',
    'vopt',
    'vradio',
    'vcen',
    'vcentre',
    'vcenter',
    'vc',
    'vpeak',
    'v0',
    'vsys',
    'cz',
    'hrv',
  ],
  size: [
    'r',
    'rad',
    'radius',
    'reff',
    'angrad',
    'angradius',
    'size',
    'angsize',
    'diam',
    'diameter',
    'angdiam',
    'd',
    'maj',
    'majaxis',
    'theta',
    'fwhm',
  ],
  positionError: [
    'epos',
    'errpos',
    'poserr',
    'poserror',
    'posunc',
    'eradec',
    'sigpos',
    'errposition',
  ],
  lineWidth: [
    'dv',
    'deltav',
    'fwhm',
    'linewidth',
    'width',
    'sigmav',
    'sigv',
    'vdisp',
    'veldisp',
    'dispersion',
    'sigma',
    'w50',
    'dvfwhm',
    'fwhmv',
    'lw',
  ],
  distance: ['d', 'dist', 'distance', 'dkpc', 'dpc', 'dsun', 'dhel', 'helcdist'],
  name: [
    'name',
    'id',
    'source',
    'src',
    'sourcename',
    'srcname',
    'designation',
    'object',
    'obj',
    'objname',
    'identifier',
    'cloud',
    'clump',
    'gname',
    'mwp',
  ],
};

const ERROR_PREFIX = /^(?:e|err|error|unc)_?(.+)$/;
const ERROR_SUFFIX = /^(.+?)_?(?:err|error|unc|e)$/;

/** Splits a unit written into a header name: `v [km/s]`, `l (deg)`, `v_kms`, `size_arcmin`. */
export function splitNameUnit(name: string): { base: string; unit: string | null } {
  const bracket = /^(.*?)\s*[([{]\s*([^)\]}]*?)\s*[)\]}]\s*$/.exec(name);
  if (bracket && bracket[1].length > 0) return { base: bracket[1], unit: bracket[2] };
  const suffix = /^(.+?)[_.]([A-Za-z/]+(?:-1)?)$/.exec(name);
  if (suffix) {
    const parsed = parseUnit(suffix[2]);
    if (parsed && parsed.kind !== 'dimensionless' && suffix[2].length > 1) {
      return { base: suffix[1], unit: suffix[2] };
    }
  }
  return { base: name, unit: null };
}

function keyOf(base: string): string {
  return base.toLowerCase().replace(/[^a-z0-9_]/g, '');
}

function analyse(col: ColumnInfo, index: number, sampleRows: string[][]): ColumnFacts {
  const { base, unit: nameUnit } = splitNameUnit(col.name.trim());
  const unitText = col.unit !== undefined && col.unit.trim() !== '' ? col.unit : nameUnit;
  const samples = sampleRows.map((r) => (r[index] ?? '').trim()).filter((s) => !isMissingCell(s));
  let min = Infinity;
  let max = -Infinity;
  let numeric = samples.length > 0;
  for (const s of samples) {
    const x = parseNumberCell(s);
    if (Number.isNaN(x)) {
      numeric = false;
      break;
    }
    min = Math.min(min, x);
    max = Math.max(max, x);
  }
  return {
    index,
    name: col.name,
    key: keyOf(base),
    unitText,
    unit: unitText === null ? null : parseUnit(unitText),
    ucd: (col.ucd ?? '')
      .toLowerCase()
      .split(';')
      .map((w) => w.trim())
      .filter((w) => w.length > 0),
    samples,
    numeric,
    sexagesimal: !numeric && samples.length > 0 && samples.every(isSexagesimalCell),
    min,
    max,
  };
}

function plainKey(key: string): string {
  return key.replace(/_/g, '');
}

/** Role from UCDs (strongest evidence). */
function roleFromUcd(f: ColumnFacts): Role | null {
  const u = f.ucd;
  if (u.length === 0) return null;
  const has = (w: string): boolean => u.some((x) => x === w || x.startsWith(`${w}.`));
  if (u.includes('stat.error')) {
    if (has('spect.dopplerveloc') || u.includes('phys.veloc')) return 'velocityError';
    if (has('pos.distance')) return 'distanceError';
    if (u.some((x) => x.startsWith('pos.'))) return 'positionError';
    return null;
  }
  if (has('pos.galactic.lon')) return 'glon';
  if (has('pos.galactic.lat')) return 'glat';
  if (has('pos.eq.ra')) return 'ra';
  if (has('pos.eq.dec')) return 'dec';
  if (has('phys.veloc.dispersion') || has('spect.line.width')) return 'lineWidth';
  if (has('spect.dopplerveloc') || u.includes('phys.veloc')) return 'velocity';
  if (has('phys.angsize')) return 'size';
  if (has('pos.distance')) return 'distance';
  if (has('meta.id')) return 'name';
  return null;
}

function isKind(f: ColumnFacts, kind: ParsedUnit['kind']): boolean {
  return f.unit !== null && f.unit.kind === kind;
}

/** Role from the header name, using the unit to tell apart `d` (size or distance), `fwhm`, `r`. */
function roleFromName(f: ColumnFacts): Role | null {
  const key = plainKey(f.key);
  const errorOf = ERROR_PREFIX.exec(f.key) ?? ERROR_SUFFIX.exec(f.key);
  if (errorOf) {
    const target = plainKey(errorOf[1]);
    if (NAME_KEYS.velocity.includes(target)) return 'velocityError';
    if (NAME_KEYS.distance.includes(target) && target !== 'd') return 'distanceError';
    if (['pos', 'position', 'radec', 'coord'].includes(target)) return 'positionError';
  }
  const angle = isKind(f, 'angle');
  const velocity = isKind(f, 'velocity');
  const distance = isKind(f, 'distance');
  const inList = (role: keyof typeof NAME_KEYS): boolean => NAME_KEYS[role].includes(key);
  if (inList('glon') && !velocity) return 'glon';
  if (inList('glat') && !velocity) return 'glat';
  if (inList('ra')) return 'ra';
  if (inList('dec')) return 'dec';
  if (inList('positionError')) return 'positionError';
  if (inList('lineWidth') && !angle && (velocity || !['sigma', 'fwhm', 'width'].includes(key))) {
    return 'lineWidth';
  }
  if (inList('velocity') && !angle) return 'velocity';
  if (inList('distance') && (distance || (key !== 'd' && !angle))) return 'distance';
  if (inList('size') && angle) return 'size';
  if (inList('name')) return 'name';
  return null;
}

function sizeKind(f: ColumnFacts): 'radius' | 'diameter' | 'fwhm' {
  const k = plainKey(f.key);
  if (k.includes('fwhm')) return 'fwhm';
  if (k === 'd' || k.includes('diam') || k.includes('size') || k.includes('maj')) return 'diameter';
  if (f.ucd.some((w) => w.startsWith('phys.angsize')) && !/^r|rad/.test(k)) return 'diameter';
  return 'radius';
}

/**
 * Suggests a column mapping from the header (names, units inside names like `(deg)`,
 * `[km/s]`, `_kms`; VOTable `unit` and `ucd`) and a few sample rows (sexagesimal text means
 * RA/Dec; a 0…360 column next to a −90…90 one is a position pair of unknown system). Never
 * throws; see {@link mappingFromSuggestion} for the strict form the upload handler uses.
 */
export function suggestMapping(header: TableHeader, sampleRows: string[][]): MappingSuggestion {
  const facts = header.columns.map((c, i) => analyse(c, i, sampleRows));
  const problems: MappingProblem[] = [];
  const notes: string[] = [];
  if (facts.length === 1) {
    problems.push({
      code: 'wrong-delimiter',
      column: facts[0].name,
      message: `only one column was found (\`${facts[0].name}\`); the file is probably separated by a different delimiter`,
    });
  }
  const byRole = new Map<Role, { f: ColumnFacts; evidence: 'ucd' | 'name' }[]>();
  for (const f of facts) {
    const ucdRole = roleFromUcd(f);
    const role = ucdRole ?? roleFromName(f);
    if (role === null) continue;
    const list = byRole.get(role) ?? [];
    list.push({ f, evidence: ucdRole ? 'ucd' : 'name' });
    byRole.set(role, list);
  }
  const first = (role: Role): ColumnFacts | undefined => {
    const list = byRole.get(role);
    if (!list) return undefined;
    return (list.find((x) => x.evidence === 'ucd' && x.f.ucd.includes('meta.main')) ?? list[0]).f;
  };
  const unknownUnit = (f: ColumnFacts, what: string): void => {
    problems.push({
      code: 'unknown-unit',
      column: f.name,
      unit: f.unitText ?? '',
      message: `column \`${f.name}\` has unit \`${f.unitText}\`, which Lanewise cannot read as ${what}`,
    });
  };

  const candidates = positionCandidates(facts, byRole, unknownUnit, notes);
  const fields = optionalFields(first, unknownUnit, notes);
  const named = candidates.filter((c) => c.evidence !== 'values');
  let chosen: PositionCandidate | null = null;
  if (named.length > 0) {
    const pick = (system: 'galactic' | 'equatorial'): PositionCandidate[] => {
      const own = named.filter((c) => c.system === system);
      const ucd = own.filter((c) => c.evidence === 'ucd');
      return ucd.length > 0 ? ucd : own;
    };
    const gal = pick('galactic');
    const eq = pick('equatorial');
    if (gal.length === 1) chosen = gal[0];
    else if (gal.length === 0 && eq.length === 1) chosen = eq[0];
  } else if (candidates.length === 1) {
    chosen = candidates[0];
  }
  const shown = named.length > 0 ? named : candidates;
  const positionProblem = chosen
    ? problems.some((p) => p.column === chosen.lon.column || p.column === chosen.lat.column)
    : false;
  let mapping: Mapping | null = null;
  if (chosen && !positionProblem && problems.length === 0) {
    mapping = mappingSchema.parse({
      position: { system: chosen.system, lon: chosen.lon, lat: chosen.lat },
      ...fields,
    });
  }
  return {
    mapping,
    positionUnambiguous: chosen !== null,
    candidates: chosen ? [chosen] : shown,
    problems,
    notes,
    fields,
  };
}

function positionCandidates(
  facts: ColumnFacts[],
  byRole: Map<Role, { f: ColumnFacts; evidence: 'ucd' | 'name' }[]>,
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): PositionCandidate[] {
  const out: PositionCandidate[] = [];
  const pairs = (lonRole: Role, latRole: Role, system: PositionCandidate['system']): void => {
    const lons = byRole.get(lonRole) ?? [];
    const lats = byRole.get(latRole) ?? [];
    for (const lon of lons) {
      const partners = lats.filter((l) => l.evidence === lon.evidence);
      if (partners.length === 0) continue;
      const lat = partners.reduce((a, b) =>
        Math.abs(b.f.index - lon.f.index) < Math.abs(a.f.index - lon.f.index) ? b : a,
      );
      const lonUnit = positionUnit(lon.f, system, 'lon', unknownUnit, notes);
      const latUnit = positionUnit(lat.f, system, 'lat', unknownUnit, notes);
      if (lonUnit === null || latUnit === null) continue;
      out.push({
        system,
        lon: { column: lon.f.name, unit: lonUnit },
        lat: { column: lat.f.name, unit: latUnit },
        evidence: lon.evidence,
      } as PositionCandidate);
    }
  };
  pairs('glon', 'glat', 'galactic');
  pairs('ra', 'dec', 'equatorial');
  if (out.length > 0) return out;

  const sex = facts.filter((f) => f.sexagesimal);
  if (sex.length >= 2) {
    out.push({
      system: 'equatorial',
      lon: { column: sex[0].name, unit: 'sexagesimal' },
      lat: { column: sex[1].name, unit: 'sexagesimal' },
      evidence: 'values',
    });
    return out;
  }
  for (let i = 0; i + 1 < facts.length; i++) {
    const a = facts[i];
    const b = facts[i + 1];
    const lonLike = a.numeric && a.min >= -180 && a.max <= 360;
    const latLike = b.numeric && b.min >= -90 && b.max <= 90;
    if (!lonLike || !latLike || a.unit?.kind === 'velocity' || b.unit?.kind === 'velocity')
      continue;
    if (out.some((c) => c.lat.column === a.name)) continue;
    for (const system of ['galactic', 'equatorial'] as const) {
      out.push({
        system,
        lon: { column: a.name, unit: 'deg' },
        lat: { column: b.name, unit: 'deg' },
        evidence: 'values',
      });
    }
  }
  return out;
}

function positionUnit(
  f: ColumnFacts,
  system: PositionCandidate['system'],
  axis: 'lon' | 'lat',
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): 'deg' | 'rad' | 'hours' | 'sexagesimal' | null {
  if (system === 'equatorial' && f.sexagesimal) return 'sexagesimal';
  if (f.unitText !== null && f.unit === null) {
    unknownUnit(f, 'an angle');
    return null;
  }
  const u = f.unit?.kind === 'angle' ? f.unit.unit : null;
  if (f.unit !== null && f.unit.kind !== 'angle' && f.unit.kind !== 'dimensionless') {
    unknownUnit(f, 'an angle');
    return null;
  }
  if (u === 'deg' || u === 'rad') return u;
  if (u === 'sexagesimal' && system === 'equatorial') return 'sexagesimal';
  if (u === 'hours' && system === 'equatorial' && axis === 'lon') return 'hours';
  if (u !== null) {
    unknownUnit(
      f,
      system === 'galactic'
        ? 'a Galactic angle'
        : `a ${axis === 'lon' ? 'right ascension' : 'declination'}`,
    );
    return null;
  }
  if (system === 'equatorial' && axis === 'lon') {
    const hoursName = /^ra_?h$/.test(f.key);
    if (
      hoursName ||
      (f.numeric && f.samples.length >= 5 && f.max <= 24 && f.min >= 0 && f.max > 1)
    ) {
      notes.push(
        `column \`${f.name}\` has no unit; its values are all below 24, so it is read as RA in hours`,
      );
      return 'hours';
    }
  }
  return 'deg';
}

function velocityUnit(
  f: ColumnFacts,
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): 'km/s' | 'm/s' | null {
  if (f.unit?.kind === 'velocity') return f.unit.unit;
  if (f.unitText !== null && f.unit?.kind !== 'dimensionless') {
    unknownUnit(f, 'a velocity');
    return null;
  }
  notes.push(`column \`${f.name}\` has no unit; km/s assumed`);
  return 'km/s';
}

function angleUnit(
  f: ColumnFacts,
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): 'arcsec' | 'arcmin' | 'deg' | 'mas' | 'rad' | null {
  const u = f.unit;
  if (u?.kind === 'angle' && u.unit !== 'hours' && u.unit !== 'sexagesimal') return u.unit;
  if (f.unitText !== null && u?.kind !== 'dimensionless') {
    unknownUnit(f, 'an angular size');
    return null;
  }
  notes.push(
    `column \`${f.name}\` looks like an angular size or error but has no unit; map it by hand`,
  );
  return null;
}

function distanceUnit(
  f: ColumnFacts,
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): 'kpc' | 'pc' | null {
  if (f.unit?.kind === 'distance') return f.unit.unit;
  if (f.unitText !== null && f.unit?.kind !== 'dimensionless') {
    unknownUnit(f, 'a distance');
    return null;
  }
  const unit = f.numeric && f.max > 100 ? 'pc' : 'kpc';
  notes.push(`column \`${f.name}\` has no unit; ${unit} assumed from its values`);
  return unit;
}

function optionalFields(
  first: (role: Role) => ColumnFacts | undefined,
  unknownUnit: (f: ColumnFacts, what: string) => void,
  notes: string[],
): Omit<Mapping, 'position'> {
  const out: Omit<Mapping, 'position'> = {};
  const v = first('velocity');
  if (v) {
    const unit = velocityUnit(v, unknownUnit, notes);
    const key = plainKey(v.key);
    const text = `${key} ${v.ucd.join(' ')}`;
    let frame: 'lsr' | 'heliocentric' = 'lsr';
    if (/lsr/.test(text)) frame = 'lsr';
    else if (/hel|bary|^cz|^hrv/.test(text)) frame = 'heliocentric';
    else notes.push(`velocity column \`${v.name}\` does not say its frame; LSR assumed`);
    let convention: 'radio' | 'optical' | 'relativistic' = 'radio';
    if (/opt|^cz/.test(text)) convention = 'optical';
    else if (/rel/.test(text)) convention = 'relativistic';
    else if (!/radio/.test(text)) {
      notes.push(`velocity column \`${v.name}\` does not say its convention; radio assumed`);
    }
    if (unit) out.velocity = { column: v.name, unit, frame, convention };
  }
  const size = first('size');
  if (size) {
    const unit = angleUnit(size, unknownUnit, notes);
    if (unit) out.size = { column: size.name, unit, kind: sizeKind(size) };
  }
  const pe = first('positionError');
  if (pe) {
    const unit = angleUnit(pe, unknownUnit, notes);
    if (unit) out.positionError = { column: pe.name, unit };
  }
  const ve = first('velocityError');
  if (ve) {
    const unit = velocityUnit(ve, unknownUnit, notes);
    if (unit) out.velocityError = { column: ve.name, unit };
  }
  const lw = first('lineWidth');
  if (lw) {
    const unit = velocityUnit(lw, unknownUnit, notes);
    const kind =
      /sig|disp/.test(plainKey(lw.key)) || lw.ucd.some((w) => w.includes('dispersion'))
        ? 'sigma'
        : 'fwhm';
    if (unit) out.lineWidth = { column: lw.name, unit, kind };
  }
  const d = first('distance');
  if (d) {
    const unit = distanceUnit(d, unknownUnit, notes);
    if (unit) out.distance = { column: d.name, unit };
    const de = first('distanceError');
    if (de && unit) {
      const eu = de.unitText === null ? unit : distanceUnit(de, unknownUnit, notes);
      if (eu) out.distanceError = { column: de.name, unit: eu };
    }
  }
  const name = first('name');
  if (name) out.name = { column: name.name };
  return out;
}

/**
 * The mapping to use when the uploader gave none: the suggestion's, or a typed error —
 * `wrong-delimiter` (one column), `unknown-unit` (names column and unit),
 * `no-position-columns` (lists the columns), `ambiguous-position-columns` (details carry the
 * candidates, which the API returns with its 422).
 */
export function mappingFromSuggestion(s: MappingSuggestion, header: TableHeader): Mapping {
  const wrong = s.problems.find((p) => p.code === 'wrong-delimiter');
  if (wrong) throw new IngestFileError('wrong-delimiter', wrong.message, { column: wrong.column });
  const unit = s.problems.find((p) => p.code === 'unknown-unit');
  if (unit) {
    throw new IngestFileError('unknown-unit', unit.message, {
      column: unit.column,
      unit: unit.unit,
    });
  }
  if (s.mapping) return s.mapping;
  const names = header.columns.map((c) => `\`${c.name}\``).join(', ');
  if (s.candidates.length === 0) {
    throw new IngestFileError(
      'no-position-columns',
      `no position columns found among ${names}; map Galactic l/b or RA/Dec by hand`,
      { columns: header.columns.map((c) => c.name) },
    );
  }
  const list = s.candidates
    .map((c) => `${c.system} (\`${c.lon.column}\`, \`${c.lat.column}\`)`)
    .join('; ');
  throw new IngestFileError(
    'ambiguous-position-columns',
    `the position columns are ambiguous: ${list}; choose one in the mapping`,
    { candidates: s.candidates },
  );
}
