/**
 * What each complex contributes to its distance: its mean sky position (the mean of its members'
 * unit vectors), its mean LSR velocity with that mean's measurement error, and a combined
 * independent distance of the members that have one. Columns, one entry per complex.
 */
import { isGasKind, type MemberColumns } from './members';

const DEG = Math.PI / 180;

/** Where a complex's velocity came from. */
export const VELOCITY_SOURCE = { none: 0, gas: 1, all: 2, allFallback: 3 } as const;

/** Per-complex inputs of the distance step. */
export type ComplexInputs = {
  lDeg: Float64Array;
  bDeg: Float64Array;
  /** Mean v_LSR of the chosen members (NaN when none has a velocity). */
  vLsrKms: Float64Array;
  /** Measurement error of that mean, √(Σ σ_i²)/n over the members with an error (0 if none has one). */
  sigmaMeasKms: Float64Array;
  /** Number of members whose velocities were averaged, and which members (see {@link VELOCITY_SOURCE}). */
  velocityMembers: Int32Array;
  velocitySource: Uint8Array;
  /** Combined independent distance (kpc) and its 1σ error, NaN when none / unknown. */
  indepDistKpc: Float64Array;
  indepErrKpc: Float64Array;
  indepMembers: Int32Array;
};

/**
 * Computes {@link ComplexInputs} from the member columns. Sky position: the direction of the sum
 * of the members' unit vectors (l in [0, 360), b in deg). Velocity: with `velocityFrom` 'gas' the
 * HI and CO members that have a velocity, falling back to all members when none does; with 'all'
 * every member with a velocity. Independent distance: the inverse-variance weighted mean when
 * every member that has a distance also has a positive error (error 1/√Σw), otherwise the plain
 * mean with an unknown (NaN) error.
 */
export function complexInputs(
  cols: MemberColumns,
  nComplexes: number,
  velocityFrom: 'gas' | 'all',
): ComplexInputs {
  const f = () => new Float64Array(nComplexes);
  const out: ComplexInputs = {
    lDeg: f(),
    bDeg: f(),
    vLsrKms: f(),
    sigmaMeasKms: f(),
    velocityMembers: new Int32Array(nComplexes),
    velocitySource: new Uint8Array(nComplexes),
    indepDistKpc: f(),
    indepErrKpc: f(),
    indepMembers: new Int32Array(nComplexes),
  };
  for (let c = 0; c < nComplexes; c++) {
    const from = cols.start[c];
    const to = cols.start[c + 1];
    skyMean(cols, from, to, out, c);
    velocity(cols, from, to, velocityFrom, out, c);
    independent(cols, from, to, out, c);
  }
  return out;
}

function skyMean(
  cols: MemberColumns,
  from: number,
  to: number,
  out: ComplexInputs,
  c: number,
): void {
  let x = 0;
  let y = 0;
  let z = 0;
  for (let i = from; i < to; i++) {
    const cb = Math.cos(cols.bDeg[i] * DEG);
    x += cb * Math.cos(cols.lDeg[i] * DEG);
    y += cb * Math.sin(cols.lDeg[i] * DEG);
    z += Math.sin(cols.bDeg[i] * DEG);
  }
  const l = Math.atan2(y, x) / DEG;
  out.lDeg[c] = l < 0 ? l + 360 : l;
  out.bDeg[c] = Math.atan2(z, Math.hypot(x, y)) / DEG;
}

function velocity(
  cols: MemberColumns,
  from: number,
  to: number,
  velocityFrom: 'gas' | 'all',
  out: ComplexInputs,
  c: number,
): void {
  const pass = (gasOnly: boolean) => {
    let n = 0;
    let sum = 0;
    let err2 = 0;
    for (let i = from; i < to; i++) {
      const v = cols.vLsrKms[i];
      if (v !== v || (gasOnly && !isGasKind(cols.kind[i]))) continue;
      n++;
      sum += v;
      const e = cols.vErrKms[i];
      if (e === e) err2 += e * e;
    }
    return { n, mean: n > 0 ? sum / n : NaN, sigma: n > 0 ? Math.sqrt(err2) / n : 0 };
  };
  let r = pass(velocityFrom === 'gas');
  let source: number = velocityFrom === 'gas' ? VELOCITY_SOURCE.gas : VELOCITY_SOURCE.all;
  if (r.n === 0 && velocityFrom === 'gas') {
    r = pass(false);
    source = VELOCITY_SOURCE.allFallback;
  }
  out.vLsrKms[c] = r.mean;
  out.sigmaMeasKms[c] = r.sigma;
  out.velocityMembers[c] = r.n;
  out.velocitySource[c] = r.n === 0 ? VELOCITY_SOURCE.none : source;
}

function independent(
  cols: MemberColumns,
  from: number,
  to: number,
  out: ComplexInputs,
  c: number,
): void {
  let n = 0;
  let sum = 0;
  let wSum = 0;
  let wdSum = 0;
  let allErrors = true;
  for (let i = from; i < to; i++) {
    const d = cols.distKpc[i];
    if (d !== d) continue;
    n++;
    sum += d;
    const e = cols.distErrKpc[i];
    if (e > 0) {
      wSum += 1 / (e * e);
      wdSum += d / (e * e);
    } else allErrors = false;
  }
  out.indepMembers[c] = n;
  if (n === 0) {
    out.indepDistKpc[c] = NaN;
    out.indepErrKpc[c] = NaN;
  } else if (allErrors) {
    out.indepDistKpc[c] = wdSum / wSum;
    out.indepErrKpc[c] = 1 / Math.sqrt(wSum);
  } else {
    out.indepDistKpc[c] = sum / n;
    out.indepErrKpc[c] = NaN;
  }
}
