import type { z } from 'zod';
import {
  CoordinateParseError,
  equatorialToGalactic,
  parseDecDeg,
  parseRaDeg,
} from '@/lib/astro/coordinates';
import { convertVelocityConvention, helioToLsrKms } from '@/lib/astro/velocity';
import {
  canonicalFieldSchemas,
  FWHM_PER_SIGMA,
  NUMERIC_FIELDS,
  type CanonicalColumns,
  type CanonicalRecord,
  type NumericField,
  type Rejection,
} from './canonical';
import { isMissingCell, parseDecimalCommaCell, parseNumberCell } from './cells';
import { IngestFileError } from './errors';
import { mappedColumns, type Mapping } from './mapping';
import type { RowBatch, TableHeader } from './types';
import { ARCSEC_PER, KMS_PER, KPC_PER } from './units';

const RAD_TO_DEG = 180 / Math.PI;

/** Thrown inside a row conversion; turned into a {@link Rejection} by the caller. */
class RowProblem {
  constructor(
    readonly reason: string,
    readonly column: string | null = null,
  ) {}
}

function problem(column: string, value: string, why: string): RowProblem {
  return new RowProblem(`field \`${column}\` value \`${value}\`: ${why}`, column);
}

/** How cells are read beyond the mapping: `decimalComma` reads `30,1` as 30.1. */
export interface NormaliseOptions {
  decimalComma?: boolean;
}

type NumberParser = (text: string) => number;

/** A scalar canonical field read from one column: value → canonical unit → range check. */
interface ScalarStep {
  field: NumericField;
  index: number;
  column: string;
  factor: number;
  schema: z.ZodNumber;
}

/** The converted values of one row, before they are stored. */
interface RowValues {
  lDeg: number;
  bDeg: number;
  scalars: Float64Array;
  vLsrKms: number;
  name: string | null;
}

/**
 * A compiled mapping: column indices, factors and checks resolved once, so that converting a
 * row costs a few number parses. `convert` fills `out` or throws a RowProblem.
 */
interface Plan {
  columnCount: number;
  convert(values: string[], out: RowValues): void;
  scalarFields: NumericField[];
}

function numberIn(values: string[], index: number, column: string, parse: NumberParser): number {
  const text = values[index];
  const x = parse(text);
  if (Number.isNaN(x)) {
    if (isMissingCell(text)) throw problem(column, text, 'a value is required');
    throw problem(column, text, 'not a number');
  }
  return x;
}

/** NaN for an empty/"no value" cell, else the number; non-numeric text is a problem. */
function optionalNumberIn(
  values: string[],
  index: number,
  column: string,
  parse: NumberParser,
): number {
  const text = values[index];
  const x = parse(text);
  if (Number.isNaN(x) && !isMissingCell(text)) throw problem(column, text, 'not a number');
  return x;
}

function check(schema: z.ZodNumber, x: number, column: string, text: string): void {
  const r = schema.safeParse(x);
  if (!r.success) throw problem(column, text, r.error.issues[0].message);
}

function coordinate(read: () => number, column: string, text: string): number {
  try {
    return read();
  } catch (e) {
    if (e instanceof CoordinateParseError) throw problem(column, text, e.message);
    throw e;
  }
}

function compile(header: TableHeader, mapping: Mapping, options: NormaliseOptions): Plan {
  const parse: NumberParser = options.decimalComma ? parseDecimalCommaCell : parseNumberCell;
  const names = header.columns.map((c) => c.name);
  const needed = mappedColumns(mapping);
  if (names.length === 1 && needed.length > 1) {
    const where = header.headerLine === null ? '' : ` on line ${header.headerLine}`;
    throw new IngestFileError(
      'wrong-delimiter',
      `only one column was found in the header${where} (\`${names[0]}\`) but the mapping needs ${needed.length}; the file is probably separated by a different delimiter than ${describeDelimiter(header)}`,
      { line: header.headerLine, header: names[0] },
    );
  }
  const indexOf = (column: string): number => {
    const i = names.indexOf(column);
    if (i === -1) {
      throw new IngestFileError(
        'unknown-column',
        `the mapping uses column \`${column}\`, which the file does not have (columns: ${names.map((n) => `\`${n}\``).join(', ')})`,
        { column },
      );
    }
    return i;
  };

  const pos = mapping.position;
  const lonIdx = indexOf(pos.lon.column);
  const latIdx = indexOf(pos.lat.column);
  const lonCol = pos.lon.column;
  const latCol = pos.lat.column;
  const readPosition = positionReader(mapping, lonIdx, latIdx, lonCol, latCol, parse);

  const steps: ScalarStep[] = [];
  const scalar = (field: NumericField, column: string, factor: number): void => {
    steps.push({
      field,
      index: indexOf(column),
      column,
      factor,
      schema: canonicalFieldSchemas[field],
    });
  };
  if (mapping.size) {
    const halve = mapping.size.kind === 'radius' ? 1 : 0.5;
    scalar('radiusArcsec', mapping.size.column, ARCSEC_PER[mapping.size.unit] * halve);
  }
  if (mapping.positionError) {
    scalar('posErrArcsec', mapping.positionError.column, ARCSEC_PER[mapping.positionError.unit]);
  }
  if (mapping.velocityError) {
    scalar('vErrKms', mapping.velocityError.column, KMS_PER[mapping.velocityError.unit]);
  }
  if (mapping.lineWidth) {
    const toSigma = mapping.lineWidth.kind === 'fwhm' ? 1 / FWHM_PER_SIGMA : 1;
    scalar('sigmaVKms', mapping.lineWidth.column, KMS_PER[mapping.lineWidth.unit] * toSigma);
  }
  if (mapping.distance) {
    scalar('distKpc', mapping.distance.column, KPC_PER[mapping.distance.unit]);
    if (mapping.distanceError) {
      scalar('distErrKpc', mapping.distanceError.column, KPC_PER[mapping.distanceError.unit]);
    }
  }

  const vel = mapping.velocity;
  const vIdx = vel ? indexOf(vel.column) : -1;
  const vFactor = vel ? KMS_PER[vel.unit] : 1;
  const nameIdx = mapping.name ? indexOf(mapping.name.column) : -1;
  const vSchema = canonicalFieldSchemas.vLsrKms;

  return {
    columnCount: names.length,
    scalarFields: steps.map((s) => s.field),
    convert(values, out) {
      readPosition(values, out);
      for (let k = 0; k < steps.length; k++) {
        const s = steps[k];
        const raw = optionalNumberIn(values, s.index, s.column, parse);
        const x = raw * s.factor;
        if (!Number.isNaN(x)) check(s.schema, x, s.column, values[s.index]);
        out.scalars[k] = x;
      }
      out.vLsrKms = NaN;
      if (vel) {
        const text = values[vIdx];
        let v = optionalNumberIn(values, vIdx, vel.column, parse) * vFactor;
        if (!Number.isNaN(v)) {
          check(vSchema, v, vel.column, text);
          // Convention first, then the frame shift, added in the radio convention as docs/methods.md ("Velocities") states it.
          if (vel.convention !== 'radio') v = toRadio(v, vel.convention, vel.column, text);
          if (vel.frame === 'heliocentric') v = helioToLsrKms(v, out.lDeg, out.bDeg);
        }
        out.vLsrKms = v;
      }
      if (nameIdx >= 0) {
        const n = values[nameIdx].trim();
        out.name = n.length > 0 ? n : null;
      } else {
        out.name = null;
      }
    },
  };
}

function toRadio(
  vKms: number,
  convention: 'optical' | 'relativistic',
  column: string,
  text: string,
): number {
  try {
    return convertVelocityConvention(vKms, convention, 'radio');
  } catch (e) {
    if (e instanceof RangeError) throw problem(column, text, e.message);
    throw e;
  }
}

function describeDelimiter(header: TableHeader): string {
  switch (header.delimiter) {
    case ',':
      return 'comma';
    case '\t':
      return 'tab';
    case ';':
      return 'semicolon';
    case 'whitespace':
      return 'whitespace';
    default:
      return 'the detected one';
  }
}

/** Reads l, b (deg) from the position columns; equatorial input goes through the J2000 → Galactic rotation. */
function positionReader(
  mapping: Mapping,
  lonIdx: number,
  latIdx: number,
  lonCol: string,
  latCol: string,
  parse: NumberParser,
): (values: string[], out: RowValues) => void {
  const pos = mapping.position;
  const lSchema = canonicalFieldSchemas.lDeg;
  const bSchema = canonicalFieldSchemas.bDeg;
  if (pos.system === 'galactic') {
    const lonFactor = pos.lon.unit === 'rad' ? RAD_TO_DEG : 1;
    const latFactor = pos.lat.unit === 'rad' ? RAD_TO_DEG : 1;
    return (values, out) => {
      const l = numberIn(values, lonIdx, lonCol, parse) * lonFactor;
      check(lSchema, l, lonCol, values[lonIdx]);
      const b = numberIn(values, latIdx, latCol, parse) * latFactor;
      check(bSchema, b, latCol, values[latIdx]);
      out.lDeg = l < 0 || l >= 360 ? ((l % 360) + 360) % 360 : l;
      out.bDeg = b;
    };
  }
  const raUnit = pos.lon.unit;
  const decUnit = pos.lat.unit;
  const readRa = (values: string[]): number => {
    const text = values[lonIdx];
    if (raUnit === 'sexagesimal') {
      if (isMissingCell(text)) throw problem(lonCol, text, 'a value is required');
      return coordinate(() => parseRaDeg(text, 'hours'), lonCol, text);
    }
    const x = numberIn(values, lonIdx, lonCol, parse);
    if (raUnit === 'rad') return coordinate(() => parseRaDeg(x * RAD_TO_DEG, 'deg'), lonCol, text);
    return coordinate(() => parseRaDeg(x, raUnit), lonCol, text);
  };
  const readDec = (values: string[]): number => {
    const text = values[latIdx];
    if (decUnit === 'sexagesimal') {
      if (isMissingCell(text)) throw problem(latCol, text, 'a value is required');
      return coordinate(() => parseDecDeg(text), latCol, text);
    }
    const x = numberIn(values, latIdx, latCol, parse) * (decUnit === 'rad' ? RAD_TO_DEG : 1);
    return coordinate(() => parseDecDeg(x), latCol, text);
  };
  return (values, out) => {
    const g = equatorialToGalactic(readRa(values), readDec(values));
    out.lDeg = g.lDeg >= 360 ? g.lDeg - 360 : g.lDeg;
    out.bDeg = g.bDeg;
  };
}

function fieldCountProblem(expected: number, found: number): RowProblem {
  const what = found > expected ? 'too many' : 'too few';
  return new RowProblem(`${what} fields: expected ${expected} (as in the header), found ${found}`);
}

function newRowValues(): RowValues {
  return {
    lDeg: 0,
    bDeg: 0,
    scalars: new Float64Array(NUMERIC_FIELDS.length),
    vLsrKms: NaN,
    name: null,
  };
}

function nullable(x: number): number | null {
  return Number.isNaN(x) ? null : x;
}

/**
 * Compiles a mapping against a header into a row function: raw cells (strings) + file line +
 * data-row number → a {@link CanonicalRecord} or a {@link Rejection} naming the column, value
 * and rule. Canonical units: l ∈ [0, 360), b (deg); v_LSR (km/s, radio convention: optical or
 * relativistic velocities are converted exactly, heliocentric ones shifted with the standard
 * solar motion); angular radius (arcsec; diameters and FWHM sizes halved); position error
 * (arcsec); velocity error (km/s); line width σ (km/s; FWHM / 2√(2 ln 2)); distance and error
 * (kpc). With `decimalComma`, numeric cells like `30,1` read as 30.1. Throws
 * {@link IngestFileError} when the mapping names a column the header lacks or the header has
 * a single column (a wrong delimiter).
 */
export function makeRowNormaliser(
  header: TableHeader,
  mapping: Mapping,
  options: NormaliseOptions = {},
): (values: string[], line: number, row?: number) => CanonicalRecord | Rejection {
  const plan = compile(header, mapping, options);
  const scratch = newRowValues();
  return (values, line, row = 0) => {
    const reason = convertRow(plan, values, scratch);
    if (reason !== null) return { row, line, reason };
    const rec: CanonicalRecord = {
      row,
      line,
      lDeg: scratch.lDeg,
      bDeg: scratch.bDeg,
      vLsrKms: nullable(scratch.vLsrKms),
      radiusArcsec: null,
      posErrArcsec: null,
      vErrKms: null,
      sigmaVKms: null,
      distKpc: null,
      distErrKpc: null,
      name: scratch.name,
      original: values,
    };
    plan.scalarFields.forEach((f, k) => {
      (rec as unknown as Record<NumericField, number | null>)[f] = nullable(scratch.scalars[k]);
    });
    return rec;
  };
}

/** True when a normaliser result is a rejection. */
export function isRejection(r: CanonicalRecord | Rejection): r is Rejection {
  return 'reason' in r;
}

function convertRow(plan: Plan, values: string[], out: RowValues): string | null {
  return findProblem(plan, values, out)?.reason ?? null;
}

function findProblem(plan: Plan, values: string[], out: RowValues): RowProblem | null {
  try {
    if (values.length !== plan.columnCount)
      throw fieldCountProblem(plan.columnCount, values.length);
    plan.convert(values, out);
    return null;
  } catch (e) {
    if (e instanceof RowProblem) return e;
    throw e;
  }
}

/** A cell that would fail normalisation: 0-based column index and the reason. */
export interface CellProblem {
  column: number;
  reason: string;
}

/**
 * Stand-ins tried in a bad cell's place to find the row's next bad cell: empty (optional
 * fields), then values every required position reader accepts.
 */
const STAND_INS = ['', '0', '0:00:00'];

/**
 * Every cell of a row that would fail normalisation under the mapping, not only the first:
 * the row is converted, the failing cell is replaced by a stand-in that passes, and the
 * conversion is repeated until the row passes. A wrong field count is reported on column -1.
 * This is what the preview marks; it uses the same rules as {@link makeBatchNormaliser}.
 */
export function makeCellChecker(
  header: TableHeader,
  mapping: Mapping,
  options: NormaliseOptions = {},
): (values: string[]) => CellProblem[] {
  const plan = compile(header, mapping, options);
  const names = header.columns.map((c) => c.name);
  const scratch = newRowValues();
  return (values) => {
    const found: CellProblem[] = [];
    const row = [...values];
    for (let guard = 0; guard <= names.length; guard++) {
      let p = findProblem(plan, row, scratch);
      if (p === null) break;
      const column = p.column === null ? -1 : names.indexOf(p.column);
      found.push({ column, reason: p.reason });
      if (column === -1) break;
      for (const standIn of STAND_INS) {
        row[column] = standIn;
        p = findProblem(plan, row, scratch);
        if (p === null || p.column !== names[column]) break;
      }
      if (p !== null && p.column === names[column]) break;
    }
    return found;
  };
}

/** Accepted rows of one batch in flat columns, and the rejected rows with their reasons. */
export interface NormalisedBatch {
  columns: CanonicalColumns;
  rejected: Rejection[];
}

/**
 * Like {@link makeRowNormaliser} but for whole batches, writing accepted rows straight into
 * flat typed arrays (NaN = no value) with no object per row; this is the ingest hot path.
 */
export function makeBatchNormaliser(
  header: TableHeader,
  mapping: Mapping,
  options: NormaliseOptions = {},
): (batch: RowBatch) => NormalisedBatch {
  const plan = compile(header, mapping, options);
  const scratch = newRowValues();
  return (batch) => {
    const n = batch.values.length;
    const cols = allocateColumns(n);
    const targets = plan.scalarFields.map((f) => cols[f]);
    const rejected: Rejection[] = [];
    let j = 0;
    for (let i = 0; i < n; i++) {
      const values = batch.values[i];
      const reason = convertRow(plan, values, scratch);
      if (reason !== null) {
        rejected.push({ row: batch.firstRow + i, line: batch.lines[i], reason });
        continue;
      }
      cols.row[j] = batch.firstRow + i;
      cols.line[j] = batch.lines[i];
      cols.lDeg[j] = scratch.lDeg;
      cols.bDeg[j] = scratch.bDeg;
      cols.vLsrKms[j] = scratch.vLsrKms;
      for (let k = 0; k < targets.length; k++) targets[k][j] = scratch.scalars[k];
      cols.name[j] = scratch.name;
      cols.original[j] = values;
      j++;
    }
    return { columns: trimColumns(cols, j), rejected };
  };
}

function allocateColumns(n: number): CanonicalColumns {
  const nan = (): Float64Array => new Float64Array(n).fill(NaN);
  return {
    count: n,
    row: new Uint32Array(n),
    line: new Uint32Array(n),
    lDeg: nan(),
    bDeg: nan(),
    vLsrKms: nan(),
    radiusArcsec: nan(),
    posErrArcsec: nan(),
    vErrKms: nan(),
    sigmaVKms: nan(),
    distKpc: nan(),
    distErrKpc: nan(),
    name: new Array<string | null>(n).fill(null),
    original: new Array<string[]>(n),
  };
}

function trimColumns(c: CanonicalColumns, n: number): CanonicalColumns {
  if (n === c.count) return c;
  return {
    count: n,
    row: c.row.subarray(0, n),
    line: c.line.subarray(0, n),
    lDeg: c.lDeg.subarray(0, n),
    bDeg: c.bDeg.subarray(0, n),
    vLsrKms: c.vLsrKms.subarray(0, n),
    radiusArcsec: c.radiusArcsec.subarray(0, n),
    posErrArcsec: c.posErrArcsec.subarray(0, n),
    vErrKms: c.vErrKms.subarray(0, n),
    sigmaVKms: c.sigmaVKms.subarray(0, n),
    distKpc: c.distKpc.subarray(0, n),
    distErrKpc: c.distErrKpc.subarray(0, n),
    name: c.name.slice(0, n),
    original: c.original.slice(0, n),
  };
}
