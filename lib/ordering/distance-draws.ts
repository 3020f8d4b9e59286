/**
 * Each complex's distance as a distribution, not a point (docs/methods.md, "Distances as
 * distributions"). Draw j of every complex shares one set of Galactic constants
 * (R0 ~ N(R0, σ_R0²), Θ0 ~ N(Θ0, σ_Θ0²)), because the constants are one systematic error common
 * to the whole field; velocities are drawn per complex, v ~ N(v, σ_meas² + σ_stream²). Each draw
 * is inverted on its own curve, and near/far is chosen per draw by the user's rule:
 * - 'probabilistic': near with probability w_n / (w_n + w_f), w = d² exp(−(d sin b)² / 2h²) × L,
 *   the number of disc sources in the beam at each root for a Gaussian layer of scale height h
 *   (both roots share R, so the radial density and |dv/dd| cancel), times the likelihood L of a
 *   member's independent distance, N(d_ind; d, σ_ind²), where there is one;
 * - 'latitude': an independent distance that separates the roots, else near when the far root
 *   lies more than 2.5 h from the plane, else the draw is unresolved;
 * - 'independent': only an independent distance decides; 'near' / 'far': always that root.
 * Where the kinematic distance cannot be used (no velocity, near l = 0°/180°) a member's
 * independent distance N(d_ind, σ_ind²) is drawn instead; a distance set by hand is used as is.
 * No arm enters here: placing sources with an arm prior would make arm offsets circular.
 */
import { KINEMATIC_FLAG_BITS, kinematicDistancesBulk } from '@/lib/astro/kinematic-distance';
import { curveWithConstants, type RotationCurve } from '@/lib/astro/rotation-curves';
import { deriveSeed, makeRng } from '@/lib/stats/rng';
import { VELOCITY_SOURCE, type ComplexInputs } from './complex-inputs';
import { isUnreliableLongitude, type ExclusionReason } from './exclusions';
import type { NearFarRule } from './types';

const DEG = Math.PI / 180;
const LATITUDE_SCALE_HEIGHTS = 2.5;
/**
 * The Galactic constants are drawn in this many sets, cycled over the draws: each set needs its
 * own tabulated solver (a few ms), and 25 sets sample a Gaussian systematic well enough for
 * 95 % intervals while keeping 200 draws fast.
 */
export const CONSTANT_SETS = 25;
/** A complex whose distance is undefined in more than this share of its draws is left out. */
export const MAX_INVALID_DRAW_SHARE = 0.5;

/** How a complex's distance draws were made. */
export type DistanceMethod = 'override' | 'independent' | 'kinematic' | 'none';

/** Settings of {@link drawDistances}. */
export type DistanceDrawSettings = {
  curve: RotationCurve;
  R0ErrKpc: number;
  theta0ErrKms: number;
  sigmaStreamKms: number;
  scaleHeightKpc: number;
  nearFar: NearFarRule;
  draws: number;
  seed: number;
};

/** Distances of n complexes × D draws: complex c's draw j at [c·D + j] (kpc, NaN = undefined). */
export type DistanceDraws = {
  count: number;
  draws: number;
  distKpc: Float64Array;
  /** R0 (kpc) and Θ0 (km/s) of each draw. */
  R0Kpc: Float64Array;
  theta0Kms: Float64Array;
  method: DistanceMethod[];
  /** Share of draws with two roots that took the near one (NaN where no draw had two roots). */
  pNear: Float64Array;
  /** Share of draws beyond the terminal velocity, placed at the tangent point. */
  tangentShare: Float64Array;
  /** Share of draws with a distance. */
  validShare: Float64Array;
  exclusion: (ExclusionReason | null)[];
};

type Independent = { d: number; sigma: number };

function rootWeight(dKpc: number, sinB: number, h: number, ind: Independent | null): number {
  const z = dKpc * sinB;
  let w = dKpc * dKpc * Math.exp((-0.5 * z * z) / (h * h));
  if (ind) {
    const u = (dKpc - ind.d) / ind.sigma;
    w *= Math.exp(-0.5 * u * u);
  }
  return w;
}

/** Near (true), far (false) or unresolved (null) for one draw with two roots. */
function chooseNear(
  rule: NearFarRule,
  near: number,
  far: number,
  bDeg: number,
  h: number,
  ind: Independent | null,
  u: number,
): boolean | null {
  if (rule === 'near') return true;
  if (rule === 'far') return false;
  const indSeparates =
    ind !== null && Math.abs(Math.abs(ind.d - near) - Math.abs(ind.d - far)) > ind.sigma;
  if (rule === 'independent')
    return indSeparates ? Math.abs(ind!.d - near) <= Math.abs(ind!.d - far) : null;
  const sinB = Math.abs(Math.sin(bDeg * DEG));
  if (rule === 'latitude') {
    if (indSeparates) return Math.abs(ind!.d - near) <= Math.abs(ind!.d - far);
    return far * sinB > LATITUDE_SCALE_HEIGHTS * h ? true : null;
  }
  const wn = rootWeight(near, sinB, h, ind);
  const wf = rootWeight(far, sinB, h, ind);
  if (!(wn + wf > 0)) return null;
  return u * (wn + wf) < wn;
}

function independentOf(inputs: ComplexInputs, c: number): Independent | null {
  const d = inputs.indepDistKpc[c];
  if (!(d > 0)) return null;
  const e = inputs.indepErrKpc[c];
  // A distance without an error is taken at 10 % (common practice for photometric distances).
  return { d, sigma: e > 0 ? e : 0.1 * d };
}

/** How each complex is placed, before any draw. */
function methodsOf(
  inputs: ComplexInputs,
  overrides: ReadonlyArray<number | null>,
): { method: DistanceMethod[]; exclusion: (ExclusionReason | null)[] } {
  const n = inputs.lDeg.length;
  const method: DistanceMethod[] = new Array(n);
  const exclusion: (ExclusionReason | null)[] = new Array(n).fill(null);
  for (let c = 0; c < n; c++) {
    const hasInd = inputs.indepDistKpc[c] > 0;
    if (overrides[c] !== null) method[c] = 'override';
    else if (inputs.velocitySource[c] === VELOCITY_SOURCE.none) {
      method[c] = hasInd ? 'independent' : 'none';
      if (!hasInd) exclusion[c] = 'no-velocity';
    } else if (isUnreliableLongitude(inputs.lDeg[c])) {
      method[c] = hasInd ? 'independent' : 'none';
      if (!hasInd) exclusion[c] = 'unreliable-longitude';
    } else method[c] = 'kinematic';
  }
  return { method, exclusion };
}

/** Each complex's velocity uncertainty: its measurement error in quadrature with streaming (km/s). */
export function velocitySigmaKms(inputs: ComplexInputs, sigmaStreamKms: number): Float64Array {
  return Float64Array.from(inputs.sigmaMeasKms, (s) => Math.sqrt(s * s + sigmaStreamKms ** 2));
}

/**
 * Draws `settings.draws` distances for every complex (see the module comment). `overrides[c]`
 * is a hand-set distance (kpc) or null. `onDraw(j)` reports progress. Reproducible from the seed.
 */
export function drawDistances(
  inputs: ComplexInputs,
  overrides: ReadonlyArray<number | null>,
  settings: DistanceDrawSettings,
  onDraw?: (done: number) => void,
): DistanceDraws {
  const n = inputs.lDeg.length;
  const D = settings.draws;
  const { curve, scaleHeightKpc: h, nearFar } = settings;
  const { method, exclusion } = methodsOf(inputs, overrides);
  const distKpc = new Float64Array(n * D).fill(NaN);
  const R0Kpc = new Float64Array(D);
  const theta0Kms = new Float64Array(D);
  const twoRoot = new Int32Array(n);
  const nearCount = new Int32Array(n);
  const tangentCount = new Int32Array(n);
  const sigmaKms = velocitySigmaKms(inputs, settings.sigmaStreamKms);
  const independent = Array.from({ length: n }, (_, c) => independentOf(inputs, c));
  const constants = makeRng(deriveSeed(settings.seed, 0));
  const fixed = settings.R0ErrKpc === 0 && settings.theta0ErrKms === 0;
  const sets = Array.from({ length: Math.min(D, CONSTANT_SETS) }, () => {
    const R0 = curve.R0Kpc + settings.R0ErrKpc * constants.normal();
    const theta0 = curve.theta0Kms + settings.theta0ErrKms * constants.normal();
    return { R0, theta0, curve: fixed ? curve : curveWithConstants(curve, R0, theta0) };
  });
  const vDraw = new Float64Array(n);
  const tangentBit = KINEMATIC_FLAG_BITS['beyond-terminal'];
  for (let j = 0; j < D; j++) {
    const set = sets[j % sets.length];
    R0Kpc[j] = set.R0;
    theta0Kms[j] = set.theta0;
    const curveJ = set.curve;
    const rng = makeRng(deriveSeed(settings.seed, j + 1));
    for (let c = 0; c < n; c++) vDraw[c] = inputs.vLsrKms[c] + sigmaKms[c] * rng.normal();
    const kd = kinematicDistancesBulk(inputs.lDeg, inputs.bDeg, vDraw, curveJ);
    for (let c = 0; c < n; c++) {
      const u = rng.next();
      const k = c * D + j;
      const m = method[c];
      if (m === 'override') distKpc[k] = overrides[c] as number;
      else if (m === 'independent') {
        const ind = independent[c] as Independent;
        const d = ind.d + ind.sigma * rng.normal();
        distKpc[k] = d > 0 ? d : NaN;
      } else if (m === 'kinematic') {
        const near = kd.nearKpc[c];
        const far = kd.farKpc[c];
        if (kd.flags[c] & tangentBit) {
          tangentCount[c]++;
          distKpc[k] = kd.tangentKpc[c];
        } else if (near === near && far === far) {
          twoRoot[c]++;
          const pick = chooseNear(nearFar, near, far, inputs.bDeg[c], h, independent[c], u);
          if (pick === true) nearCount[c]++;
          distKpc[k] = pick === null ? NaN : pick ? near : far;
        } else distKpc[k] = far === far ? far : near;
      }
    }
    onDraw?.(j + 1);
  }
  const pNear = Float64Array.from(twoRoot, (t, c) => (t > 0 ? nearCount[c] / t : NaN));
  const tangentShare = Float64Array.from(tangentCount, (t) => t / D);
  const validShare = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    let valid = 0;
    for (let j = 0; j < D; j++) if (distKpc[c * D + j] === distKpc[c * D + j]) valid++;
    validShare[c] = valid / D;
    if (exclusion[c] === null && validShare[c] < 1 - MAX_INVALID_DRAW_SHARE)
      exclusion[c] = twoRoot[c] > 0 ? 'unresolved-near-far' : 'no-distance';
  }
  return {
    count: n,
    draws: D,
    distKpc,
    R0Kpc,
    theta0Kms,
    method,
    pNear,
    tangentShare,
    validShare,
    exclusion,
  };
}
