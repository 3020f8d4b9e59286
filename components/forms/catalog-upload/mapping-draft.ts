import { mappingSchema, type Mapping } from '@/lib/ingest/mapping';

/**
 * The mapping screen's editable state: every field a string, `''` meaning "not in this file".
 * Units, frames and kinds keep a value even when their column is unset, so choosing a column
 * later starts from a sensible default.
 */
export interface MappingDraft {
  system: 'galactic' | 'equatorial';
  lonColumn: string;
  lonUnit: string;
  latColumn: string;
  latUnit: string;
  velocityColumn: string;
  velocityUnit: string;
  velocityFrame: string;
  velocityConvention: string;
  sizeColumn: string;
  sizeUnit: string;
  sizeKind: string;
  positionErrorColumn: string;
  positionErrorUnit: string;
  velocityErrorColumn: string;
  velocityErrorUnit: string;
  lineWidthColumn: string;
  lineWidthUnit: string;
  lineWidthKind: string;
  distanceColumn: string;
  distanceUnit: string;
  distanceErrorColumn: string;
  distanceErrorUnit: string;
  nameColumn: string;
}

/** Units the mapping accepts for each position axis, by coordinate system. */
export const POSITION_UNITS = {
  galactic: { lon: ['deg', 'rad'], lat: ['deg', 'rad'] },
  equatorial: { lon: ['deg', 'hours', 'rad', 'sexagesimal'], lat: ['deg', 'rad', 'sexagesimal'] },
} as const;

export const EMPTY_DRAFT: MappingDraft = {
  system: 'galactic',
  lonColumn: '',
  lonUnit: 'deg',
  latColumn: '',
  latUnit: 'deg',
  velocityColumn: '',
  velocityUnit: 'km/s',
  velocityFrame: 'lsr',
  velocityConvention: 'radio',
  sizeColumn: '',
  sizeUnit: 'arcsec',
  sizeKind: 'radius',
  positionErrorColumn: '',
  positionErrorUnit: 'arcsec',
  velocityErrorColumn: '',
  velocityErrorUnit: 'km/s',
  lineWidthColumn: '',
  lineWidthUnit: 'km/s',
  lineWidthKind: 'fwhm',
  distanceColumn: '',
  distanceUnit: 'kpc',
  distanceErrorColumn: '',
  distanceErrorUnit: 'kpc',
  nameColumn: '',
};

/** A draft holding everything a (possibly partial) suggested mapping says. */
export function draftFromMapping(m: Partial<Mapping>): MappingDraft {
  const d = m.position ? withPosition(EMPTY_DRAFT, m.position) : { ...EMPTY_DRAFT };
  if (m.velocity) {
    d.velocityColumn = m.velocity.column;
    d.velocityUnit = m.velocity.unit;
    d.velocityFrame = m.velocity.frame;
    d.velocityConvention = m.velocity.convention;
  }
  if (m.size) {
    d.sizeColumn = m.size.column;
    d.sizeUnit = m.size.unit;
    d.sizeKind = m.size.kind;
  }
  if (m.positionError) {
    d.positionErrorColumn = m.positionError.column;
    d.positionErrorUnit = m.positionError.unit;
  }
  if (m.velocityError) {
    d.velocityErrorColumn = m.velocityError.column;
    d.velocityErrorUnit = m.velocityError.unit;
  }
  if (m.lineWidth) {
    d.lineWidthColumn = m.lineWidth.column;
    d.lineWidthUnit = m.lineWidth.unit;
    d.lineWidthKind = m.lineWidth.kind;
  }
  if (m.distance) {
    d.distanceColumn = m.distance.column;
    d.distanceUnit = m.distance.unit;
  }
  if (m.distanceError) {
    d.distanceErrorColumn = m.distanceError.column;
    d.distanceErrorUnit = m.distanceError.unit;
  }
  if (m.name) d.nameColumn = m.name.column;
  return d;
}

/** The draft with its position columns, units and system taken from `p`. */
export function withPosition(d: MappingDraft, p: Mapping['position']): MappingDraft {
  return {
    ...d,
    system: p.system,
    lonColumn: p.lon.column,
    lonUnit: p.lon.unit,
    latColumn: p.lat.column,
    latUnit: p.lat.unit,
  };
}

/** Switches the coordinate system, keeping units the new system accepts. */
export function withSystem(d: MappingDraft, system: MappingDraft['system']): MappingDraft {
  const units = POSITION_UNITS[system];
  const keep = (u: string, allowed: readonly string[]) => (allowed.includes(u) ? u : 'deg');
  return {
    ...d,
    system,
    lonUnit: keep(d.lonUnit, units.lon),
    latUnit: keep(d.latUnit, units.lat),
  };
}

const FIELD_WORDS: Record<string, string> = {
  position: 'position',
  velocity: 'velocity',
  size: 'size',
  positionError: 'position error',
  velocityError: 'velocity error',
  lineWidth: 'line width',
  distance: 'distance',
  distanceError: 'distance error',
  name: 'name',
};

/**
 * The mapping a draft describes, checked by the same schema the server uses, or the first
 * problem in plain words (which field, what is wrong).
 */
export function mappingFromDraft(d: MappingDraft): { mapping: Mapping } | { problem: string } {
  if (!d.lonColumn || !d.latColumn) {
    return { problem: 'Choose the columns that hold the longitude and the latitude.' };
  }
  const raw: Record<string, unknown> = {
    position: {
      system: d.system,
      lon: { column: d.lonColumn, unit: d.lonUnit },
      lat: { column: d.latColumn, unit: d.latUnit },
    },
  };
  if (d.velocityColumn) {
    raw.velocity = {
      column: d.velocityColumn,
      unit: d.velocityUnit,
      frame: d.velocityFrame,
      convention: d.velocityConvention,
    };
  }
  if (d.sizeColumn) raw.size = { column: d.sizeColumn, unit: d.sizeUnit, kind: d.sizeKind };
  if (d.positionErrorColumn) {
    raw.positionError = { column: d.positionErrorColumn, unit: d.positionErrorUnit };
  }
  if (d.velocityErrorColumn) {
    raw.velocityError = { column: d.velocityErrorColumn, unit: d.velocityErrorUnit };
  }
  if (d.lineWidthColumn) {
    raw.lineWidth = { column: d.lineWidthColumn, unit: d.lineWidthUnit, kind: d.lineWidthKind };
  }
  if (d.distanceColumn) raw.distance = { column: d.distanceColumn, unit: d.distanceUnit };
  if (d.distanceErrorColumn) {
    raw.distanceError = { column: d.distanceErrorColumn, unit: d.distanceErrorUnit };
  }
  if (d.nameColumn) raw.name = { column: d.nameColumn };
  const parsed = mappingSchema.safeParse(raw);
  if (parsed.success) return { mapping: parsed.data };
  const issue = parsed.error.issues[0];
  const field = FIELD_WORDS[String(issue.path[0])] ?? String(issue.path[0]);
  return { problem: `${field[0].toUpperCase()}${field.slice(1)}: ${issue.message}.` };
}

/** Which canonical field each file column feeds, for labelling the preview's headers. */
export function roleOfColumns(d: MappingDraft): Map<string, string[]> {
  const roles = new Map<string, string[]>();
  const add = (column: string, role: string) => {
    if (!column) return;
    roles.set(column, [...(roles.get(column) ?? []), role]);
  };
  add(d.lonColumn, d.system === 'galactic' ? 'l' : 'RA');
  add(d.latColumn, d.system === 'galactic' ? 'b' : 'Dec');
  add(d.velocityColumn, 'velocity');
  add(d.sizeColumn, 'size');
  add(d.positionErrorColumn, 'position error');
  add(d.velocityErrorColumn, 'velocity error');
  add(d.lineWidthColumn, 'line width');
  add(d.distanceColumn, 'distance');
  add(d.distanceErrorColumn, 'distance error');
  add(d.nameColumn, 'name');
  return roles;
}
