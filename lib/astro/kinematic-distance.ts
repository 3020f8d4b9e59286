/**
 * Kinematic distances for circular Galactic rotation.
 *
 * v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0), Θ0 = Θ(R0) (SCIENCE.md §4; e.g. Roman-Duval et al.
 * 2009). The solver finds R from v_LSR (Θ/R falls monotonically with R for every supported
 * curve), then the in-plane distances d = R0 cos l ± √(R² − R0² sin² l), and divides by cos b
 * for line-of-sight distances. All distances returned are line-of-sight, in kpc.
 *
 * Result shape: inside the solar circle (R < R0, only for cos l > 0) there are two roots, `nearKpc`
 * and `farKpc`. Outside it (R > R0) there is one root; it is the "+" branch of the formula, so it is
 * reported as `farKpc` with `nearKpc: null` and the flag 'outer-galaxy' — this keeps `farKpc`
 * continuous as a source crosses the solar circle. A velocity beyond the terminal velocity is
 * placed at the tangent point (near = far = tangent, R = R0 |sin l|) with 'beyond-terminal'.
 * `tangentKpc` is the tangent-point distance R0 cos l / cos b of the sight line whenever
 * cos l > 0, else null.
 */

import type { RotationCurve } from './rotation-curves';
import { makeRng, deriveSeed } from '../stats/rng';
import { quantileSelectInPlace } from '../stats/summary';

const DEG = Math.PI / 180;

/**
 * Flags on a kinematic distance:
 * - 'beyond-terminal': |v_LSR| exceeds the terminal velocity of the sight line; the source is
 *   placed at the tangent point.
 * - 'near-tangent': two roots, but v_LSR is within {@link NEAR_TANGENT_KMS} of the terminal
 *   velocity, i.e. within typical streaming motions, so near and far cannot be told apart.
 * - 'unreliable-longitude': within {@link UNRELIABLE_LONGITUDE_DEG} of l = 0° or 180°, where
 *   v_LSR hardly changes with distance and non-circular motions dominate (common practice).
 * - 'outer-galaxy': R > R0; one root, reported as `farKpc`.
 * - 'no-solution': no point on the sight line has this velocity under circular rotation
 *   (a forbidden velocity, e.g. v > 0 in the second quadrant), or l = 0°/180° / |b| = 90°
 *   where v_LSR does not depend on distance, or R outside 0.01–1000 kpc.
 */
export type KinematicFlag =
  'beyond-terminal' | 'near-tangent' | 'unreliable-longitude' | 'outer-galaxy' | 'no-solution';

/** Bit of each flag in the `flags` bitmask of {@link kinematicDistancesBulk}. */
export const KINEMATIC_FLAG_BITS: Readonly<Record<KinematicFlag, number>> = Object.freeze({
  'beyond-terminal': 1,
  'near-tangent': 2,
  'unreliable-longitude': 4,
  'outer-galaxy': 8,
  'no-solution': 16,
});

const FLAG_ORDER = Object.keys(KINEMATIC_FLAG_BITS) as KinematicFlag[];
const BEYOND = 1;
const NEAR_TANGENT = 2;
const UNRELIABLE = 4;
const OUTER = 8;
const NONE = 16;

/** Velocity window (km/s) around the terminal velocity flagged 'near-tangent' (typical streaming, common practice). */
export const NEAR_TANGENT_KMS = 7;
/** Half-width (deg) of the longitude windows around l = 0° and 180° flagged 'unreliable-longitude' (common practice). */
export const UNRELIABLE_LONGITUDE_DEG = 10;

/** Flags named by a bitmask from {@link kinematicDistancesBulk}. */
export function flagsFromBits(bits: number): KinematicFlag[] {
  return FLAG_ORDER.filter((f) => (bits & KINEMATIC_FLAG_BITS[f]) !== 0);
}

/** A kinematic distance: Galactocentric radius and line-of-sight distances in kpc (null where none exists). */
export type KinematicDistance = {
  RKpc: number | null;
  nearKpc: number | null;
  farKpc: number | null;
  tangentKpc: number | null;
  flags: KinematicFlag[];
};

const R_MIN_KPC = 0.01;
const R_MAX_KPC = 1000;

/**
 * LSR radial velocity (km/s) of a point at Galactic (l, b) in degrees and line-of-sight distance
 * distKpc, in circular rotation on the given curve (R0 and Θ0 from the curve).
 */
export function vLsrAtKms(
  lDeg: number,
  bDeg: number,
  distKpc: number,
  curve: RotationCurve,
): number {
  const R0 = curve.R0Kpc;
  const cb = Math.cos(bDeg * DEG);
  const k = R0 * Math.sin(lDeg * DEG) * cb;
  if (k === 0) return 0;
  const dPlane = distKpc * cb;
  const R = Math.sqrt(
    Math.max(0, R0 * R0 + dPlane * dPlane - 2 * R0 * dPlane * Math.cos(lDeg * DEG)),
  );
  return k * (curve.thetaKms(R) / R - curve.theta0Kms / R0);
}

/** Solves Θ(R)/R = target for R; returns −1 below R_MIN_KPC and +Infinity above R_MAX_KPC. */
type SolveR = (omegaTarget: number) => number;

type Solver = { omega: (RKpc: number) => number; solve: SolveR };

function bisectionSolver(curve: RotationCurve): Solver {
  const omega = (R: number) => curve.thetaKms(R) / R;
  const wMin = omega(R_MIN_KPC);
  const wMax = omega(R_MAX_KPC);
  const solve: SolveR = (target) => {
    if (target > wMin) return -1;
    if (target < wMax) return Infinity;
    let lo = Math.log(R_MIN_KPC);
    let hi = Math.log(R_MAX_KPC);
    for (let i = 0; i < 200 && hi - lo > 1e-15; i++) {
      const mid = 0.5 * (lo + hi);
      if (omega(Math.exp(mid)) > target) lo = mid;
      else hi = mid;
    }
    return Math.exp(0.5 * (lo + hi));
  };
  return { omega, solve };
}

const TABLE_SIZE = 8193;
const tableCache = new WeakMap<RotationCurve, Solver>();

/**
 * Fast solver: Θ/R tabulated against u = ln R on a uniform grid (checked to fall strictly with
 * R), with slopes from a five-point stencil, and inverted by a bin lookup in ln ω plus Newton steps on
 * the cubic Hermite interpolant (interpolation error ~h⁴, relative ~1e-13 here). No curve
 * evaluation per solve, which keeps Monte Carlo runs fast.
 */
function tableSolver(curve: RotationCurve): Solver {
  const cached = tableCache.get(curve);
  if (cached) return cached;
  const exact = (R: number) => curve.thetaKms(R) / R;
  const lnMin = Math.log(R_MIN_KPC);
  const h = (Math.log(R_MAX_KPC) - lnMin) / (TABLE_SIZE - 1);
  const ext = new Float64Array(TABLE_SIZE + 4);
  for (let j = 0; j < ext.length; j++) ext[j] = exact(Math.exp(lnMin + (j - 2) * h));
  const w = ext.subarray(2, TABLE_SIZE + 2);
  const hd = new Float64Array(TABLE_SIZE);
  for (let i = 0; i < TABLE_SIZE; i++) {
    if (!Number.isFinite(w[i]) || (i > 0 && !(w[i] < w[i - 1]))) {
      throw new RangeError(
        `rotation curve ${curve.name}: Θ/R does not fall with R near R = ${Math.exp(lnMin + i * h).toPrecision(4)} kpc, so kinematic distances are not single-valued`,
      );
    }
    // h · dω/du at node i (five-point central difference)
    hd[i] = (-ext[i + 4] + 8 * ext[i + 3] - 8 * ext[i + 1] + ext[i]) / 12;
  }
  const last = TABLE_SIZE - 1;
  // O(1) bracketing: bins uniform in ln ω, each holding the last node at or above its upper edge.
  const BINS = 4 * TABLE_SIZE;
  const lnW0 = Math.log(w[0]);
  const binScale = BINS / (lnW0 - Math.log(w[last]));
  const binStart = new Int32Array(BINS);
  for (let b = 0, node = 0; b < BINS; b++) {
    const upper = Math.exp(lnW0 - b / binScale);
    while (node < last - 1 && w[node + 1] >= upper) node++;
    binStart[b] = node;
  }
  const hermite = (i: number, t: number) => {
    const t2 = t * t;
    const t3 = t2 * t;
    return (
      (2 * t3 - 3 * t2 + 1) * w[i] +
      (t3 - 2 * t2 + t) * hd[i] +
      (3 * t2 - 2 * t3) * w[i + 1] +
      (t3 - t2) * hd[i + 1]
    );
  };
  const omega = (R: number) => {
    const x = (Math.log(R) - lnMin) / h;
    if (!(x >= 0 && x < last)) return exact(R);
    const i = Math.floor(x);
    return hermite(i, x - i);
  };
  const solve: SolveR = (target) => {
    if (target > w[0]) return -1;
    if (target < w[last]) return Infinity;
    const bin = Math.min(BINS - 1, Math.floor((lnW0 - Math.log(target)) * binScale));
    let lo = binStart[bin];
    while (lo < last - 1 && w[lo + 1] >= target) lo++;
    const hi = lo + 1;
    const w0 = w[lo];
    const w1 = w[hi];
    const d0 = hd[lo];
    const d1 = hd[hi];
    let t = (w0 - target) / (w0 - w1);
    for (let k = 0; k < 3; k++) {
      const t2 = t * t;
      const f = hermite(lo, t) - target;
      const df = (6 * t2 - 6 * t) * (w0 - w1) + (3 * t2 - 4 * t + 1) * d0 + (3 * t2 - 2 * t) * d1;
      if (df === 0) break;
      t = Math.min(1, Math.max(0, t - f / df));
    }
    return Math.exp(lnMin + (lo + t) * h);
  };
  const solver = { omega, solve };
  tableCache.set(curve, solver);
  return solver;
}

type Out = {
  RKpc: Float64Array;
  nearKpc: Float64Array;
  farKpc: Float64Array;
  tangentKpc: Float64Array;
  flags: Uint16Array;
};

function isUnreliableLongitude(lDeg: number): boolean {
  const l = ((lDeg % 360) + 360) % 360;
  return (
    l < UNRELIABLE_LONGITUDE_DEG ||
    l > 360 - UNRELIABLE_LONGITUDE_DEG ||
    Math.abs(l - 180) < UNRELIABLE_LONGITUDE_DEG
  );
}

/** Everything about a sight line that does not depend on the velocity (reused across MC draws). */
type SightLine = {
  sl: number;
  cl: number;
  cb: number;
  k: number;
  baseFlags: number;
  tangentKpc: number;
  Rt: number;
  omegaT: number;
  vTerminalKms: number;
};

function newSightLine(): SightLine {
  return {
    sl: 0,
    cl: 0,
    cb: 0,
    k: 0,
    baseFlags: 0,
    tangentKpc: NaN,
    Rt: NaN,
    omegaT: NaN,
    vTerminalKms: NaN,
  };
}

function prepareSightLine(
  lDeg: number,
  bDeg: number,
  R0: number,
  omega0: number,
  solver: Solver,
  s: SightLine,
): void {
  s.sl = Math.sin(lDeg * DEG);
  s.cl = Math.cos(lDeg * DEG);
  s.cb = Math.cos(bDeg * DEG);
  s.k = R0 * s.sl * s.cb;
  s.baseFlags = isUnreliableLongitude(lDeg) ? UNRELIABLE : 0;
  if (!(Math.abs(s.k) > 1e-12 * R0)) s.baseFlags |= NONE;
  s.tangentKpc = s.cl > 0 && s.cb > 0 ? (R0 * s.cl) / s.cb : NaN;
  if (s.cl > 0) {
    s.Rt = R0 * Math.abs(s.sl);
    s.omegaT = solver.omega(s.Rt);
    s.vTerminalKms = s.k * (s.omegaT - omega0);
  } else {
    s.Rt = NaN;
    s.omegaT = NaN;
    s.vTerminalKms = NaN;
  }
}

/** Core of every entry point: one velocity on a prepared sight line, written into slot i. */
function solveOnSightLine(
  s: SightLine,
  vLsrKms: number,
  R0: number,
  omega0: number,
  solver: Solver,
  out: Out,
  i: number,
): void {
  let flags = s.baseFlags;
  out.RKpc[i] = NaN;
  out.nearKpc[i] = NaN;
  out.farKpc[i] = NaN;
  out.tangentKpc[i] = s.tangentKpc;
  if ((flags & NONE) !== 0 || !Number.isFinite(vLsrKms)) {
    out.flags[i] = flags | NONE;
    return;
  }
  const target = omega0 + vLsrKms / s.k;
  if (s.cl > 0) {
    if (target > s.omegaT) {
      out.RKpc[i] = s.Rt;
      out.nearKpc[i] = s.tangentKpc;
      out.farKpc[i] = s.tangentKpc;
      out.flags[i] = flags | BEYOND;
      return;
    }
    if (Math.abs(vLsrKms - s.vTerminalKms) < NEAR_TANGENT_KMS) flags |= NEAR_TANGENT;
  }
  const R = target > 0 ? solver.solve(target) : Infinity;
  if (!(R > 0) || R === Infinity || (s.cl <= 0 && R < R0 * (1 - 1e-12))) {
    out.flags[i] = (flags & ~NEAR_TANGENT) | NONE;
    return;
  }
  out.RKpc[i] = R;
  const sq = Math.sqrt(Math.max(0, R * R - R0 * R0 * s.sl * s.sl));
  if (R > R0 * (1 + 1e-12) || s.cl <= 0) {
    out.farKpc[i] = Math.max(0, R0 * s.cl + sq) / s.cb;
    out.flags[i] = flags | OUTER;
    return;
  }
  out.nearKpc[i] = Math.max(0, R0 * s.cl - sq) / s.cb;
  out.farKpc[i] = (R0 * s.cl + sq) / s.cb;
  out.flags[i] = flags;
}

function solveOne(
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  R0: number,
  omega0: number,
  solver: Solver,
  out: Out,
  i: number,
  s: SightLine,
): void {
  prepareSightLine(lDeg, bDeg, R0, omega0, solver, s);
  solveOnSightLine(s, vLsrKms, R0, omega0, solver, out, i);
}

function nullable(x: number): number | null {
  return Number.isNaN(x) ? null : x;
}

function makeOut(n: number): Out {
  return {
    RKpc: new Float64Array(n),
    nearKpc: new Float64Array(n),
    farKpc: new Float64Array(n),
    tangentKpc: new Float64Array(n),
    flags: new Uint16Array(n),
  };
}

/**
 * Kinematic distance of one source at Galactic (l, b) in degrees with LSR velocity vLsrKms
 * (km/s), for circular rotation on `curve`. Solves by plain bisection on the exact curve (the
 * bulk version uses a tabulated solver; the two agree to ~1e-10 kpc). See the module comment
 * for the result shape and {@link KinematicFlag} for the flags.
 */
export function kinematicDistance(
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  curve: RotationCurve,
): KinematicDistance {
  const out = makeOut(1);
  solveOne(
    lDeg,
    bDeg,
    vLsrKms,
    curve.R0Kpc,
    curve.theta0Kms / curve.R0Kpc,
    bisectionSolver(curve),
    out,
    0,
    newSightLine(),
  );
  return {
    RKpc: nullable(out.RKpc[0]),
    nearKpc: nullable(out.nearKpc[0]),
    farKpc: nullable(out.farKpc[0]),
    tangentKpc: nullable(out.tangentKpc[0]),
    flags: flagsFromBits(out.flags[0]),
  };
}

/**
 * Kinematic distances for many sources at once: l, b (deg) and v_LSR (km/s) columns in; R, near,
 * far and tangent columns (kpc, NaN where none exists) and a flag bitmask
 * ({@link KINEMATIC_FLAG_BITS}) out. Same rules as {@link kinematicDistance}, with a tabulated
 * Θ/R inversion (about 1e6 sources per second or better).
 */
export function kinematicDistancesBulk(
  lDeg: Float64Array,
  bDeg: Float64Array,
  vLsrKms: Float64Array,
  curve: RotationCurve,
): Out {
  const n = lDeg.length;
  if (bDeg.length !== n || vLsrKms.length !== n) {
    throw new RangeError(`column lengths differ: l ${n}, b ${bDeg.length}, v ${vLsrKms.length}`);
  }
  const out = makeOut(n);
  const solver = tableSolver(curve);
  const R0 = curve.R0Kpc;
  const omega0 = curve.theta0Kms / R0;
  const sight = newSightLine();
  for (let i = 0; i < n; i++)
    solveOne(lDeg[i], bDeg[i], vLsrKms[i], R0, omega0, solver, out, i, sight);
  return out;
}

/** Median and central 68 % interval (16th–84th percentiles) of one root over the draws that have it. */
export type McInterval = { medianKpc: number; loKpc: number; hiKpc: number; fraction: number };

/** Monte Carlo kinematic distance: intervals for near, far and R (null when no draw has that root). */
export type MonteCarloDistance = {
  near: McInterval | null;
  far: McInterval | null;
  R: McInterval | null;
  draws: number;
  sigmaTotalKms: number;
};

/** Options of the Monte Carlo distance; σ_stream defaults to 7 km/s (common practice). */
export type MonteCarloOptions = { draws?: number; sigmaStreamKms?: number; seed?: number };

function interval(values: Float64Array, count: number, draws: number): McInterval | null {
  if (count === 0) return null;
  const drawn = values.subarray(0, count);
  return {
    medianKpc: quantileSelectInPlace(drawn, 0.5),
    loKpc: quantileSelectInPlace(drawn, 0.16),
    hiKpc: quantileSelectInPlace(drawn, 0.84),
    fraction: count / draws,
  };
}

type McScratch = {
  near: Float64Array;
  far: Float64Array;
  R: Float64Array;
  one: Out;
  sight: SightLine;
};

function runMonteCarlo(
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  sigmaKms: number,
  curve: RotationCurve,
  solver: Solver,
  draws: number,
  seed: number,
  scratch: McScratch,
  withR: boolean,
): MonteCarloDistance {
  const rng = makeRng(seed);
  const R0 = curve.R0Kpc;
  const omega0 = curve.theta0Kms / R0;
  const { one, sight } = scratch;
  prepareSightLine(lDeg, bDeg, R0, omega0, solver, sight);
  let nNear = 0;
  let nFar = 0;
  let nR = 0;
  for (let j = 0; j < draws; j++) {
    solveOnSightLine(sight, vLsrKms + sigmaKms * rng.normal(), R0, omega0, solver, one, 0);
    const near = one.nearKpc[0];
    const far = one.farKpc[0];
    const R = one.RKpc[0];
    if (near === near) scratch.near[nNear++] = near;
    if (far === far) scratch.far[nFar++] = far;
    if (R === R) scratch.R[nR++] = R;
  }
  return {
    near: interval(scratch.near, nNear, draws),
    far: interval(scratch.far, nFar, draws),
    R: withR ? interval(scratch.R, nR, draws) : null,
    draws,
    sigmaTotalKms: sigmaKms,
  };
}

function mcSetup(sigmaMeasKms: number, options: MonteCarloOptions) {
  const draws = options.draws ?? 1000;
  const sigmaStream = options.sigmaStreamKms ?? 7;
  if (!Number.isInteger(draws) || draws < 1)
    throw new RangeError(`draws = ${draws} must be a positive integer`);
  if (!(sigmaStream >= 0)) throw new RangeError(`sigmaStreamKms = ${sigmaStream} must be ≥ 0`);
  if (!(sigmaMeasKms >= 0)) throw new RangeError(`sigmaMeasKms = ${sigmaMeasKms} must be ≥ 0`);
  return { draws, sigmaKms: Math.hypot(sigmaMeasKms, sigmaStream), seed: options.seed ?? 1 };
}

function makeScratch(draws: number): McScratch {
  return {
    near: new Float64Array(draws),
    far: new Float64Array(draws),
    R: new Float64Array(draws),
    one: makeOut(1),
    sight: newSightLine(),
  };
}

/**
 * Monte Carlo kinematic distance (SCIENCE.md §4): draws v ~ N(v_LSR, σ_meas² + σ_stream²),
 * solves each draw, and reports the median and 16th–84th percentile interval of the near root,
 * the far root (which includes single outer-Galaxy roots) and R over the draws where each
 * exists, with the fraction of such draws. Draws beyond the terminal velocity count at the
 * tangent point for both roots. Reproducible for a given seed (default 1).
 */
export function monteCarloDistance(
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  sigmaMeasKms: number,
  curve: RotationCurve,
  options: MonteCarloOptions = {},
): MonteCarloDistance {
  const { draws, sigmaKms, seed } = mcSetup(sigmaMeasKms, options);
  return runMonteCarlo(
    lDeg,
    bDeg,
    vLsrKms,
    sigmaKms,
    curve,
    tableSolver(curve),
    draws,
    seed,
    makeScratch(draws),
    true,
  );
}

/** Column results of {@link monteCarloDistancesBulk}: kpc, NaN where a root never occurs. */
export type MonteCarloColumns = {
  nearMedianKpc: Float64Array;
  nearLoKpc: Float64Array;
  nearHiKpc: Float64Array;
  nearFraction: Float64Array;
  farMedianKpc: Float64Array;
  farLoKpc: Float64Array;
  farHiKpc: Float64Array;
  farFraction: Float64Array;
};

/**
 * {@link monteCarloDistance} for many sources: l, b (deg), v_LSR and σ_meas (km/s; one value for
 * all or a column) in; near/far medians, 16th/84th percentiles (kpc) and fractions out. Source i
 * uses the seed deriveSeed(seed, i), so its result equals the single-source call with that seed
 * whatever else is in the batch.
 */
export function monteCarloDistancesBulk(
  lDeg: Float64Array,
  bDeg: Float64Array,
  vLsrKms: Float64Array,
  sigmaMeasKms: Float64Array | number,
  curve: RotationCurve,
  options: MonteCarloOptions = {},
): MonteCarloColumns {
  const n = lDeg.length;
  if (
    bDeg.length !== n ||
    vLsrKms.length !== n ||
    (typeof sigmaMeasKms !== 'number' && sigmaMeasKms.length !== n)
  ) {
    throw new RangeError('l, b, v and sigma columns must have the same length');
  }
  const cols: MonteCarloColumns = {
    nearMedianKpc: new Float64Array(n),
    nearLoKpc: new Float64Array(n),
    nearHiKpc: new Float64Array(n),
    nearFraction: new Float64Array(n),
    farMedianKpc: new Float64Array(n),
    farLoKpc: new Float64Array(n),
    farHiKpc: new Float64Array(n),
    farFraction: new Float64Array(n),
  };
  const solver = tableSolver(curve);
  const first = mcSetup(typeof sigmaMeasKms === 'number' ? sigmaMeasKms : 0, options);
  const scratch = makeScratch(first.draws);
  for (let i = 0; i < n; i++) {
    const sigma =
      typeof sigmaMeasKms === 'number'
        ? first.sigmaKms
        : mcSetup(sigmaMeasKms[i], options).sigmaKms;
    const r = runMonteCarlo(
      lDeg[i],
      bDeg[i],
      vLsrKms[i],
      sigma,
      curve,
      solver,
      first.draws,
      deriveSeed(first.seed, i),
      scratch,
      false,
    );
    cols.nearMedianKpc[i] = r.near?.medianKpc ?? NaN;
    cols.nearLoKpc[i] = r.near?.loKpc ?? NaN;
    cols.nearHiKpc[i] = r.near?.hiKpc ?? NaN;
    cols.nearFraction[i] = r.near?.fraction ?? 0;
    cols.farMedianKpc[i] = r.far?.medianKpc ?? NaN;
    cols.farLoKpc[i] = r.far?.loKpc ?? NaN;
    cols.farHiKpc[i] = r.far?.hiKpc ?? NaN;
    cols.farFraction[i] = r.far?.fraction ?? 0;
  }
  return cols;
}

/** Inputs of {@link resolveAmbiguity}. Distances in kpc (line-of-sight), latitude in degrees. */
export type AmbiguityInput = {
  nearKpc: number | null;
  farKpc: number | null;
  bDeg: number;
  independentDistKpc?: number;
  independentErrKpc?: number;
  scaleHeightKpc?: number;
  maxScaleHeights?: number;
};

/** Outcome of {@link resolveAmbiguity}: the root chosen, its distance (kpc) and why. */
export type AmbiguityResolution = {
  choice: 'near' | 'far' | 'tangent' | 'single' | 'unresolved';
  distKpc: number | null;
  reason: string;
};

/** Default thickness of the young-disc layer (kpc) used by the latitude rule; editable per project (common practice). */
export const DEFAULT_SCALE_HEIGHT_KPC = 0.06;

/**
 * Chooses between the near and far kinematic roots (SCIENCE.md §4, common practice):
 * 1. no root → 'unresolved'; one root (outer Galaxy) → 'single'; equal roots → 'tangent';
 * 2. with an independent distance (parallax or photometric, kpc) → the root closer to it, unless
 *    its error bar does not separate them (the rejected root is not farther from it by more than
 *    `independentErrKpc`) → 'unresolved';
 * 3. else latitude: 'near' when the far root would put the source more than `maxScaleHeights`
 *    (default 2.5) scale heights (default {@link DEFAULT_SCALE_HEIGHT_KPC}) from the plane, |z| =
 *    d_far sin|b|; otherwise 'unresolved'.
 */
export function resolveAmbiguity(input: AmbiguityInput): AmbiguityResolution {
  const { nearKpc, farKpc, bDeg } = input;
  const scaleHeight = input.scaleHeightKpc ?? DEFAULT_SCALE_HEIGHT_KPC;
  const maxHeights = input.maxScaleHeights ?? 2.5;
  if (!(scaleHeight > 0)) throw new RangeError(`scaleHeightKpc = ${scaleHeight} must be positive`);
  if (!(maxHeights > 0)) throw new RangeError(`maxScaleHeights = ${maxHeights} must be positive`);
  if (nearKpc === null && farKpc === null) {
    return {
      choice: 'unresolved',
      distKpc: null,
      reason: 'no kinematic distance for this velocity',
    };
  }
  if (nearKpc === null || farKpc === null) {
    const d = (nearKpc ?? farKpc) as number;
    return { choice: 'single', distKpc: d, reason: 'outside the solar circle: one kinematic root' };
  }
  if (Math.abs(farKpc - nearKpc) <= 1e-9 * Math.max(1, farKpc)) {
    return {
      choice: 'tangent',
      distKpc: nearKpc,
      reason: 'at the tangent point: near and far coincide',
    };
  }
  const ind = input.independentDistKpc;
  if (ind !== undefined && Number.isFinite(ind)) {
    const dNear = Math.abs(ind - nearKpc);
    const dFar = Math.abs(ind - farKpc);
    const choice = dNear <= dFar ? 'near' : 'far';
    const margin = Math.abs(dNear - dFar);
    const err = input.independentErrKpc;
    const shown = `${ind.toFixed(2)}${err !== undefined ? ` ± ${err.toFixed(2)}` : ''} kpc`;
    if (err !== undefined && margin <= err) {
      return {
        choice: 'unresolved',
        distKpc: null,
        reason: `independent distance ${shown} does not separate near ${nearKpc.toFixed(2)} and far ${farKpc.toFixed(2)} kpc`,
      };
    }
    return {
      choice,
      distKpc: choice === 'near' ? nearKpc : farKpc,
      reason: `independent distance ${shown} is closer to the ${choice} root`,
    };
  }
  const zFar = farKpc * Math.abs(Math.sin(bDeg * DEG));
  const zLimit = maxHeights * scaleHeight;
  if (zFar > zLimit) {
    return {
      choice: 'near',
      distKpc: nearKpc,
      reason: `the far root puts the source at |z| = ${zFar.toFixed(3)} kpc, more than ${maxHeights} scale heights (${zLimit.toFixed(3)} kpc) from the plane`,
    };
  }
  return {
    choice: 'unresolved',
    distKpc: null,
    reason: `both roots lie within ${maxHeights} scale heights of the plane (far |z| = ${zFar.toFixed(3)} kpc); latitude cannot decide`,
  };
}
