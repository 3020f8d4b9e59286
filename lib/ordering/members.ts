/**
 * The members of all complexes as flat columns (one typed array per quantity, members of complex
 * c at rows start[c] … start[c + 1] − 1), validated on the way in. Angles in degrees (l wrapped to
 * [0, 360)), velocities in km/s, distances in kpc; NaN marks a missing value.
 */
import type { OrderingComplex, TracerKind } from './types';

/** Tracer classes in result order; a member's `kind` column holds its index here. */
export const TRACER_KINDS: readonly TracerKind[] = ['hi', 'co', 'hii', 'ob', 'other'];
/** Index of each tracer kind in {@link TRACER_KINDS}. */
export const KIND_INDEX: Readonly<Record<TracerKind, number>> = {
  hi: 0,
  co: 1,
  hii: 2,
  ob: 3,
  other: 4,
};

/** True for the gas classes (HI, CO). */
export function isGasKind(kindIndex: number): boolean {
  return kindIndex === 0 || kindIndex === 1;
}

/** True for the young-star classes (HII regions, OB associations). */
export function isYoungKind(kindIndex: number): boolean {
  return kindIndex === 2 || kindIndex === 3;
}

/** Member columns of a set of complexes. */
export type MemberColumns = {
  count: number;
  /** Row offsets per complex (length complexes + 1). */
  start: Int32Array;
  complexIndex: Int32Array;
  kind: Uint8Array;
  lDeg: Float64Array;
  bDeg: Float64Array;
  vLsrKms: Float64Array;
  vErrKms: Float64Array;
  distKpc: Float64Array;
  distErrKpc: Float64Array;
};

function where(complex: OrderingComplex, c: number, m: number): string {
  return `complex ${JSON.stringify(complex.id)} (#${c + 1}), member ${m + 1}`;
}

function optionalNonNegative(value: number, field: string, at: string): number {
  if (typeof value !== 'number' || (!Number.isNaN(value) && !(value >= 0 && value < Infinity)))
    throw new RangeError(`${at}: ${field} = ${value} must be a non-negative number or NaN`);
  return value;
}

/**
 * Flattens and validates the members of `complexes`. Throws RangeError naming the complex (id and
 * position), the member and the field for: no members, an unknown kind, a non-finite longitude,
 * a latitude outside [−90°, 90°], a non-numeric or infinite velocity, a negative error, or a
 * non-positive independent distance. Missing optional values are NaN.
 */
export function flattenMembers(complexes: OrderingComplex[]): MemberColumns {
  let count = 0;
  complexes.forEach((cx, c) => {
    if (typeof cx.id !== 'string')
      throw new RangeError(`complex #${c + 1}: id = ${String(cx.id)} must be a string`);
    if (!Array.isArray(cx.members) || cx.members.length === 0)
      throw new RangeError(`complex ${JSON.stringify(cx.id)} (#${c + 1}) has no members`);
    count += cx.members.length;
  });
  const f = () => new Float64Array(count);
  const cols: MemberColumns = {
    count,
    start: new Int32Array(complexes.length + 1),
    complexIndex: new Int32Array(count),
    kind: new Uint8Array(count),
    lDeg: f(),
    bDeg: f(),
    vLsrKms: f(),
    vErrKms: f(),
    distKpc: f(),
    distErrKpc: f(),
  };
  let row = 0;
  complexes.forEach((cx, c) => {
    cols.start[c] = row;
    cx.members.forEach((m, j) => {
      const at = where(cx, c, j);
      const kind = KIND_INDEX[m.kind];
      if (kind === undefined || !Object.hasOwn(KIND_INDEX, m.kind))
        throw new RangeError(
          `${at}: kind = ${JSON.stringify(m.kind)} is not one of ${TRACER_KINDS.join(', ')}`,
        );
      if (!Number.isFinite(m.lDeg))
        throw new RangeError(`${at}: lDeg = ${m.lDeg} must be a finite number`);
      if (!(m.bDeg >= -90 && m.bDeg <= 90))
        throw new RangeError(`${at}: bDeg = ${m.bDeg} must lie in [−90, 90]`);
      if (typeof m.vLsrKms !== 'number' || m.vLsrKms === Infinity || m.vLsrKms === -Infinity)
        throw new RangeError(`${at}: vLsrKms = ${m.vLsrKms} must be a finite number or NaN`);
      if (
        typeof m.distKpc !== 'number' ||
        (!Number.isNaN(m.distKpc) && !(m.distKpc > 0 && m.distKpc < Infinity))
      )
        throw new RangeError(`${at}: distKpc = ${m.distKpc} must be a positive number or NaN`);
      cols.complexIndex[row] = c;
      cols.kind[row] = kind;
      cols.lDeg[row] = ((m.lDeg % 360) + 360) % 360;
      cols.bDeg[row] = m.bDeg;
      cols.vLsrKms[row] = m.vLsrKms;
      cols.vErrKms[row] = optionalNonNegative(m.vErrKms, 'vErrKms', at);
      cols.distKpc[row] = m.distKpc;
      cols.distErrKpc[row] = optionalNonNegative(m.distErrKpc, 'distErrKpc', at);
      row++;
    });
  });
  cols.start[complexes.length] = row;
  return cols;
}
