/**
 * Kinematic distances for circular Galactic rotation (docs/methods.md, "Kinematic distances").
 *
 * v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0), with the curve's Θ0 (e.g. Roman-Duval et al. 2009).
 * The solver finds R from v_LSR (Θ/R falls monotonically with R for every supported curve),
 * then the in-plane distances d = R0 cos l ± √(R² − R0² sin² l), and divides by cos b for
 * line-of-sight distances. All distances returned are line-of-sight, in kpc.
 *
 * Velocities come in the standard (kinematic) LSR. A curve fitted in its own frame (Reid et al.
 * 2009, 2014, 2019) has them moved into it first: the standard solar motion is taken out and the
 * curve's put in, and the sources' mean lag V_s adds to Θ(R) (Reid et al. 2009, appendix). The
 * sources' mean inward motion U_s is not applied: its projection depends on where the source is
 * on the sight line, so it cannot be moved into the velocity before inverting, and including it
 * makes v(d) lose its symmetry about the tangent point; it is ≤ 3 km/s (2014) and 6 km/s (2019),
 * inside the streaming uncertainty.
 *
 * Result shape: inside the solar circle (R < R0, only for cos l > 0) there are two roots, `nearKpc`
 * and `farKpc`. Outside it (R > R0) there is one root; it is the "+" branch of the formula, so it is
 * reported as `farKpc` with `nearKpc: null` and the flag 'outer-galaxy' — this keeps `farKpc`
 * continuous as a source crosses the solar circle. A velocity beyond the terminal velocity is
 * placed at the tangent point (near = far = tangent, R = R0 |sin l|) with 'beyond-terminal'.
 * `tangentKpc` is the tangent-point distance R0 cos l / cos b of the sight line whenever
 * cos l > 0, else null.
 */

import { curveWithConstants, type RotationCurve } from './rotation-curves';
import { KINEMATIC_LSR, solarMotionProjectionKms } from './velocity';
import { makeRng, deriveSeed } from '../stats/rng';
import { quantileSelectInPlace } from '../stats/summary';

const DEG = Math.PI / 180;

/**
 * Flags on a kinematic distance:
 * - 'beyond-terminal': |v_LSR| exceeds the terminal velocity of the sight line; the source is
 *   placed at the tangent point.
 * - 'near-tangent': two roots closer together than the velocity uncertainty σ_v can tell apart:
 *   half their separation times the gradient |dv/dd| at the roots is below σ_v (each root's 1σ
 *   distance interval reaches the tangent point). σ_v is the source's own velocity uncertainty,
 *   {@link DEFAULT_VELOCITY_SIGMA_KMS} by default.
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

/** Velocity uncertainty (km/s) assumed for the near-tangent test when a source has none: typical streaming motions (common practice). */
export const DEFAULT_VELOCITY_SIGMA_KMS = 7;

/**
 * Half-width (deg) of the zones around l = 0° and 180° where kinematic distances are unreliable,
 * for the calculators and the analyses alike. 15°: the sight line then passes within
 * R0 sin 15° ≈ 2.2 kpc of the Galactic centre, where the bar's non-circular motions dominate,
 * and v_LSR changes by only a few km/s per kpc toward both l = 0° and 180° (common practice).
 */
export const UNRELIABLE_LONGITUDE_DEG = 15;

/** True when l (deg, any range) lies within {@link UNRELIABLE_LONGITUDE_DEG} of 0° or 180°. */
export function isUnreliableLongitude(lDeg: number): boolean {
  const l = ((lDeg % 360) + 360) % 360;
  return (
    l < UNRELIABLE_LONGITUDE_DEG ||
    l > 360 - UNRELIABLE_LONGITUDE_DEG ||
    Math.abs(l - 180) < UNRELIABLE_LONGITUDE_DEG
  );
}

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
 * Standard-LSR radial velocity (km/s) of a point at Galactic (l, b) in degrees and line-of-sight
 * distance distKpc, moving on the given curve (R0, Θ0 and, where the curve has one, its frame:
 * the sources' mean lag V_s added to Θ and the curve's solar motion exchanged for the standard
 * one). The forward model that {@link kinematicDistance} inverts.
 */
export function vLsrAtKms(
  lDeg: number,
  bDeg: number,
  distKpc: number,
  curve: RotationCurve,
): number {
  const R0 = curve.R0Kpc;
  const cb = Math.cos(bDeg * DEG);
  const cl = Math.cos(lDeg * DEG);
  const k = R0 * Math.sin(lDeg * DEG) * cb;
  const dPlane = distKpc * cb;
  const R = Math.sqrt(Math.max(0, R0 * R0 + dPlane * dPlane - 2 * R0 * dPlane * cl));
  const circular = k === 0 || !(R > 0) ? 0 : k * (sourceOmega(curve)(R) - curve.theta0Kms / R0);
  return circular - frameShiftKms(lDeg, bDeg, curve);
}

/** v_curve − v_standard-LSR (km/s) toward (l, b): the curve's solar motion in place of the standard one. */
export function frameShiftKms(lDeg: number, bDeg: number, curve: RotationCurve): number {
  if (!curve.frame) return 0;
  return (
    solarMotionProjectionKms(lDeg, bDeg, curve.frame.solarMotion) -
    solarMotionProjectionKms(lDeg, bDeg, KINEMATIC_LSR)
  );
}

/** Solves Θ(R)/R = target for R; returns −1 below R_MIN_KPC and +Infinity above R_MAX_KPC. */
type SolveR = (omegaTarget: number) => number;

type Solver = { omega: (RKpc: number) => number; solve: SolveR };

/**
 * Angular speed of the sources, (Θ(R) + V_s)/R: a mean lag V_s adds to the circular speed. Where
 * Θ < 10 |V_s| (the inner ~0.2 kpc) the lag tapers in proportion to Θ, so that the angular speed
 * still falls with R and the inversion stays single-valued.
 */
function sourceOmega(curve: RotationCurve): (RKpc: number) => number {
  const vs = curve.frame?.sourceVKms ?? 0;
  if (vs === 0) return (R) => curve.thetaKms(R) / R;
  const full = 10 * Math.abs(vs);
  return (R) => {
    const theta = curve.thetaKms(R);
    return (theta + vs * Math.min(1, theta / full)) / R;
  };
}

function bisectionSolver(curve: RotationCurve): Solver {
  const omega = sourceOmega(curve);
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
  const exact = sourceOmega(curve);
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

/** The curve as the solver uses it: R0, the Sun's angular speed Θ0/R0, Θ/R inversion. */
type Model = { R0: number; omega0: number; solver: Solver; curve: RotationCurve };

function makeModel(curve: RotationCurve, solver: Solver): Model {
  return {
    R0: curve.R0Kpc,
    omega0: curve.theta0Kms / curve.R0Kpc,
    solver,
    curve,
  };
}

/** Everything about a sight line that does not depend on the velocity (reused across MC draws). */
type SightLine = {
  sl: number;
  cl: number;
  cb: number;
  k: number;
  shiftKms: number;
  baseFlags: number;
  tangentKpc: number;
  Rt: number;
  omegaT: number;
};

function newSightLine(): SightLine {
  return {
    sl: 0,
    cl: 0,
    cb: 0,
    k: 0,
    shiftKms: 0,
    baseFlags: 0,
    tangentKpc: NaN,
    Rt: NaN,
    omegaT: NaN,
  };
}

function prepareSightLine(lDeg: number, bDeg: number, m: Model, s: SightLine): void {
  const R0 = m.R0;
  s.sl = Math.sin(lDeg * DEG);
  s.cl = Math.cos(lDeg * DEG);
  s.cb = Math.cos(bDeg * DEG);
  s.k = R0 * s.sl * s.cb;
  s.shiftKms = frameShiftKms(lDeg, bDeg, m.curve);
  s.baseFlags = isUnreliableLongitude(lDeg) ? UNRELIABLE : 0;
  if (!(Math.abs(s.k) > 1e-12 * R0)) s.baseFlags |= NONE;
  s.tangentKpc = s.cl > 0 && s.cb > 0 ? (R0 * s.cl) / s.cb : NaN;
  if (s.cl > 0) {
    s.Rt = R0 * Math.abs(s.sl);
    s.omegaT = m.solver.omega(s.Rt);
  } else {
    s.Rt = NaN;
    s.omegaT = NaN;
  }
}

/** True when the two roots at R cannot be told apart with velocity uncertainty sigmaKms (see 'near-tangent'). */
function rootsUnresolved(s: SightLine, m: Model, R: number, sq: number, sigmaKms: number): boolean {
  const e = 1e-5 * R;
  const dOmega = (m.solver.omega(R + e) - m.solver.omega(R - e)) / (2 * e);
  // half-separation sq/cb times |dv/dd| = |k ω'(R)| cb sq / R
  return (Math.abs(s.k * dOmega) * sq * sq) / R < sigmaKms;
}

/** Core of every entry point: one standard-LSR velocity on a prepared sight line, written into slot i. */
function solveOnSightLine(
  s: SightLine,
  vLsrKms: number,
  sigmaKms: number,
  m: Model,
  out: Out,
  i: number,
): void {
  const R0 = m.R0;
  let flags = s.baseFlags;
  out.RKpc[i] = NaN;
  out.nearKpc[i] = NaN;
  out.farKpc[i] = NaN;
  out.tangentKpc[i] = s.tangentKpc;
  if ((flags & NONE) !== 0 || !Number.isFinite(vLsrKms)) {
    out.flags[i] = flags | NONE;
    return;
  }
  const vKms = vLsrKms + s.shiftKms;
  const target = m.omega0 + vKms / s.k;
  if (s.cl > 0 && target > s.omegaT) {
    out.RKpc[i] = s.Rt;
    out.nearKpc[i] = s.tangentKpc;
    out.farKpc[i] = s.tangentKpc;
    out.flags[i] = flags | BEYOND;
    return;
  }
  const R = circularRoot(s, m, target);
  if (Number.isNaN(R)) {
    out.flags[i] = flags | NONE;
    return;
  }
  out.RKpc[i] = R;
  const sq = Math.sqrt(Math.max(0, R * R - R0 * R0 * s.sl * s.sl));
  if (R > R0 * (1 + 1e-12) || s.cl <= 0) {
    out.farKpc[i] = Math.max(0, R0 * s.cl + sq) / s.cb;
    out.flags[i] = flags | OUTER;
    return;
  }
  if (rootsUnresolved(s, m, R, sq, sigmaKms)) flags |= NEAR_TANGENT;
  out.nearKpc[i] = Math.max(0, R0 * s.cl - sq) / s.cb;
  out.farKpc[i] = (R0 * s.cl + sq) / s.cb;
  out.flags[i] = flags;
}

/** Root R of the circular model for angular-speed target, or NaN where there is none on this sight line. */
function circularRoot(s: SightLine, m: Model, target: number): number {
  const R = target > 0 ? m.solver.solve(target) : Infinity;
  if (!(R > 0) || R === Infinity || (s.cl <= 0 && R < m.R0 * (1 - 1e-12))) return NaN;
  return R;
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

function checkSigma(sigmaKms: number, where: string): number {
  if (!(sigmaKms > 0) || !Number.isFinite(sigmaKms)) {
    throw new RangeError(`${where}: velocity uncertainty ${sigmaKms} km/s must be positive`);
  }
  return sigmaKms;
}

/**
 * Kinematic distance of one source at Galactic (l, b) in degrees with standard-LSR velocity
 * vLsrKms (km/s), on `curve` (in its frame, if it has one). `vErrKms` is the source's 1σ
 * velocity uncertainty (km/s, measurement and streaming together) for the 'near-tangent' test,
 * {@link DEFAULT_VELOCITY_SIGMA_KMS} by default. Solves by plain bisection on the exact curve
 * (the bulk version uses a tabulated solver; the two agree to ~1e-10 kpc). See the module
 * comment for the result shape and {@link KinematicFlag} for the flags.
 */
export function kinematicDistance(
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  curve: RotationCurve,
  vErrKms: number = DEFAULT_VELOCITY_SIGMA_KMS,
): KinematicDistance {
  const sigma = checkSigma(vErrKms, 'kinematicDistance');
  const out = makeOut(1);
  const m = makeModel(curve, bisectionSolver(curve));
  const s = newSightLine();
  prepareSightLine(lDeg, bDeg, m, s);
  solveOnSightLine(s, vLsrKms, sigma, m, out, 0);
  return {
    RKpc: nullable(out.RKpc[0]),
    nearKpc: nullable(out.nearKpc[0]),
    farKpc: nullable(out.farKpc[0]),
    tangentKpc: nullable(out.tangentKpc[0]),
    flags: flagsFromBits(out.flags[0]),
  };
}

/**
 * Kinematic distances for many sources at once: l, b (deg) and standard-LSR v (km/s) columns in,
 * with an optional 1σ velocity uncertainty (km/s; one value or a column) for the 'near-tangent'
 * test; R, near, far and tangent columns (kpc, NaN where none exists) and a flag bitmask
 * ({@link KINEMATIC_FLAG_BITS}) out. Same rules as {@link kinematicDistance}, with a tabulated
 * Θ/R inversion (about 1e6 sources per second or better).
 */
export function kinematicDistancesBulk(
  lDeg: Float64Array,
  bDeg: Float64Array,
  vLsrKms: Float64Array,
  curve: RotationCurve,
  vErrKms: Float64Array | number = DEFAULT_VELOCITY_SIGMA_KMS,
): Out {
  const n = lDeg.length;
  if (
    bDeg.length !== n ||
    vLsrKms.length !== n ||
    (typeof vErrKms !== 'number' && vErrKms.length !== n)
  ) {
    throw new RangeError(
      `column lengths differ: l ${n}, b ${bDeg.length}, v ${vLsrKms.length}${typeof vErrKms === 'number' ? '' : `, vErr ${vErrKms.length}`}`,
    );
  }
  const one = typeof vErrKms === 'number' ? checkSigma(vErrKms, 'kinematicDistancesBulk') : 0;
  const out = makeOut(n);
  const m = makeModel(curve, tableSolver(curve));
  const sight = newSightLine();
  for (let i = 0; i < n; i++) {
    const sigma =
      typeof vErrKms === 'number'
        ? one
        : checkSigma(vErrKms[i], `kinematicDistancesBulk, source ${i}`);
    prepareSightLine(lDeg[i], bDeg[i], m, sight);
    solveOnSightLine(sight, vLsrKms[i], sigma, m, out, i);
  }
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
  const m = makeModel(curve, solver);
  const { one, sight } = scratch;
  prepareSightLine(lDeg, bDeg, m, sight);
  let nNear = 0;
  let nFar = 0;
  let nR = 0;
  for (let j = 0; j < draws; j++) {
    solveOnSightLine(sight, vLsrKms + sigmaKms * rng.normal(), sigmaKms, m, one, 0);
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
 * Monte Carlo kinematic distance (docs/methods.md, "Kinematic distances"): draws v ~ N(v_LSR, σ_meas² + σ_stream²),
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
 * Chooses between the near and far kinematic roots (docs/methods.md, "Kinematic distances"; common practice):
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

/** 68 % intervals (16th–84th percentiles, kpc) of one kind of root per source; NaN where no draw has it. */
export type RootIntervalColumns = {
  loKpc: Float64Array;
  hiKpc: Float64Array;
  /** Share of the draws that have this root. */
  fraction: Float64Array;
};

/**
 * Monte Carlo intervals of {@link kinematicIntervalsBulk}: the two inner roots and the single
 * outer-Galaxy root apart, so that a draw crossing the solar circle never mixes them.
 */
export type KinematicIntervals = {
  near: RootIntervalColumns;
  far: RootIntervalColumns;
  single: RootIntervalColumns;
  draws: number;
  /** True when R0 and Θ0 were drawn from the curve's published 1σ as well. */
  constantsDrawn: boolean;
};

/** Options of {@link kinematicIntervalsBulk}: number of draws (default 200), seed (default 1), whether to draw R0/Θ0 (default true). */
export type KinematicIntervalOptions = { draws?: number; seed?: number; drawConstants?: boolean };

function intervalColumns(n: number): RootIntervalColumns {
  return {
    loKpc: new Float64Array(n).fill(NaN),
    hiKpc: new Float64Array(n).fill(NaN),
    fraction: new Float64Array(n),
  };
}

/**
 * Monte Carlo 68 % intervals of the kinematic roots for many sources (docs/methods.md,
 * "Kinematic distances"). Draw j moves every velocity by its own 1σ (`vErrKms`, km/s,
 * measurement and streaming together; one value or a column) and, when `drawConstants` is on
 * and the curve publishes them, shares one R0 ~ N(R0, σ_R0) and Θ0 ~ N(Θ0, σ_Θ0) across all
 * sources (the same Galaxy for every source of a draw; {@link curveWithConstants}). Each draw
 * is solved as {@link kinematicDistancesBulk} solves it; near and far collect the inner roots
 * (a draw beyond the terminal velocity counts at the tangent point for both), `single` the
 * outer-Galaxy roots. Source i draws from deriveSeed(seed, i) and the constants from
 * deriveSeed(seed, −1), so a source's interval does not depend on what else is in the batch.
 */
export function kinematicIntervalsBulk(
  lDeg: Float64Array,
  bDeg: Float64Array,
  vLsrKms: Float64Array,
  vErrKms: Float64Array | number,
  curve: RotationCurve,
  options: KinematicIntervalOptions = {},
): KinematicIntervals {
  const n = lDeg.length;
  const D = options.draws ?? 200;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(D) || D < 2)
    throw new RangeError(`kinematicIntervalsBulk: draws = ${D} must be an integer ≥ 2`);
  if (
    bDeg.length !== n ||
    vLsrKms.length !== n ||
    (typeof vErrKms !== 'number' && vErrKms.length !== n)
  ) {
    throw new RangeError(
      'kinematicIntervalsBulk: l, b, v and vErr columns must have the same length',
    );
  }
  const sigma =
    typeof vErrKms === 'number'
      ? new Float64Array(n).fill(checkSigma(vErrKms, 'kinematicIntervalsBulk'))
      : Float64Array.from(vErrKms, (s, i) => checkSigma(s, `kinematicIntervalsBulk, source ${i}`));
  const R0Err = curve.R0ErrKpc ?? 0;
  const theta0Err = curve.theta0ErrKms ?? 0;
  const constantsDrawn = (options.drawConstants ?? true) && (R0Err > 0 || theta0Err > 0);
  const constantsRng = makeRng(deriveSeed(seed, -1));
  const rngs = Array.from({ length: n }, (_, i) => makeRng(deriveSeed(seed, i)));
  // Float32 keeps 10 000 sources × 200 draws × 3 roots at 24 MB; 1e-7 relative is far below any interval.
  const near = new Float32Array(n * D).fill(NaN);
  const far = new Float32Array(n * D).fill(NaN);
  const single = new Float32Array(n * D).fill(NaN);
  const vDraw = new Float64Array(n);
  for (let j = 0; j < D; j++) {
    let curveJ = curve;
    if (constantsDrawn) {
      // Truncated at 3σ so that a draw never asks for a non-positive R0 or Θ0.
      const zR = Math.max(-3, Math.min(3, constantsRng.normal()));
      const zT = Math.max(-3, Math.min(3, constantsRng.normal()));
      curveJ = curveWithConstants(
        curve,
        curve.R0Kpc + R0Err * zR,
        curve.theta0Kms + theta0Err * zT,
      );
    }
    for (let i = 0; i < n; i++) vDraw[i] = vLsrKms[i] + sigma[i] * rngs[i].normal();
    const out = kinematicDistancesBulk(lDeg, bDeg, vDraw, curveJ, sigma);
    for (let i = 0; i < n; i++) {
      const at = i * D + j;
      if ((out.flags[i] & OUTER) !== 0) single[at] = out.farKpc[i];
      else {
        near[at] = out.nearKpc[i];
        far[at] = out.farKpc[i];
      }
    }
  }
  const result: KinematicIntervals = {
    near: intervalColumns(n),
    far: intervalColumns(n),
    single: intervalColumns(n),
    draws: D,
    constantsDrawn,
  };
  const scratch = new Float64Array(D);
  const summarise = (all: Float32Array, cols: RootIntervalColumns, i: number) => {
    let m = 0;
    for (let j = 0; j < D; j++) {
      const x = all[i * D + j];
      if (x === x) scratch[m++] = x;
    }
    cols.fraction[i] = m / D;
    if (m === 0) return;
    const drawn = scratch.subarray(0, m);
    cols.loKpc[i] = quantileSelectInPlace(drawn, 0.16);
    cols.hiKpc[i] = quantileSelectInPlace(drawn, 0.84);
  };
  for (let i = 0; i < n; i++) {
    summarise(near, result.near, i);
    summarise(far, result.far, i);
    summarise(single, result.single, i);
  }
  return result;
}
