/**
 * The tangent-point method of the ordering analysis (Milky Way): near the longitude where a line
 * of sight grazes an arm, each tracer class's longitude profile peaks and then ends; the
 * longitudes at which the classes end differ by Δl, which gives their separation across the arm
 * without kinematic distances (the idea of comparing tracers' tangent longitudes: e.g. Vallée
 * 2014, ApJS 215, 1; Hou & Han 2015, MNRAS 454, 626). Angles in degrees, lengths in kpc, times
 * in Myr; frame of `@/lib/astro/galactocentric`.
 *
 * Class tangent longitude: a Gaussian-kernel profile of the class's sources in signed longitude
 * around the model tangent. Sources spread evenly along a ridge crowd towards its tangent as
 * 1/√(l_t − l) (the tangent is a caustic); scatter across the arm and the kernel blur that with a
 * Gaussian of some width σ. Because the caustic has no scale of its own, the blurred profile
 * falls through the true tangent at a fixed fraction of its peak height, whatever σ is:
 * F(0)/max F = 0.8422 for F(y) = ∫₀^∞ x^(−1/2) φ(y + x) dx (the peak lies 0.765 σ inside). The
 * estimator is therefore the outer crossing of background + 0.8422 × (peak − background), the
 * background being the profile's lowest value outward of the peak. The peak itself (biased
 * 0.765 σ inward) and the half-maximum edge (0.70 σ outward) are not used: with 50 pc of scatter
 * at 5 kpc, σ ≈ 0.6° and either would miss by about 0.4°.
 *
 * Across-arm offset: a copy of the ridge shifted along its normal by n touches the sight line at
 * the shifted longitude, and n follows from that longitude exactly for a log spiral
 * (`tangentNormalOffsetKpc`); Δn = n(to) − n(from) is positive when `to` lies AHEAD of `from` in
 * the sense of rotation, in either quadrant. To first order Δn = d_t Δl, d_t the distance from the
 * Sun to the arm's tangent point (not R0 cos l, the sight line's own tangent point, which is
 * further away in the first quadrant and nearer in the fourth). ΔR = R0 |cos l̄| Δl is reported
 * as well: the change in the sight line's tangent-point radius R0 |sin l|, signed like Δl.
 *
 * Intervals: cluster bootstrap (complexes drawn with replacement; Davison & Hinkley 1997, §3.8),
 * every class estimated on the same resample, so Δl, Δn and Δt intervals are percentiles of
 * per-resample differences. Seeded; tangent k uses the stream deriveSeed(seed, k).
 */

import { wrap180Deg, wrap360Deg } from '@/lib/astro/angles';
import {
  armTangentLongitudes,
  tangentNormalOffsetKpc,
  type ArmTangent,
} from '@/lib/astro/arm-tangents';
import type { ArmSpec } from '@/lib/astro/arms';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { delayMyr } from '@/lib/astro/pattern-speed';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { deriveSeed, makeRng } from '@/lib/stats/rng';
import { quantileSorted } from '@/lib/stats/summary';
import { CI_LEVEL } from './cluster-bootstrap';
import { TRACER_KINDS } from './members';
import type { Ci, TracerKind } from './types';

const DEG = Math.PI / 180;

/**
 * Fraction of its peak height at which a Gaussian-blurred 1/√x caustic passes through the
 * caustic's edge: F(0)/max F with F(y) = 2 ∫₀^∞ φ(y + u²) du (quadrature; the unit test recomputes it).
 */
export const CAUSTIC_EDGE_LEVEL = 0.842238;
/** Profile grid spacing as a fraction of the kernel σ (linear binning, Wand 1994). */
const GRID_PER_KERNEL = 3;
/** Kernel truncation in kernel σ. */
const KERNEL_REACH = 4;
/** Largest share of resamples in which a class's edge may be missing before its interval is withheld. */
const MAX_FAILED_SHARE = 0.05;

/** Source columns: one row per source; `kind` holds a TRACER_KINDS index, `cluster` the complex (resampled together). */
export type TangentInput = {
  lDeg: Float64Array;
  bDeg: Float64Array;
  vLsrKms: Float64Array;
  kind: Uint8Array;
  cluster: Int32Array;
};

/** Settings of the tangent-point method. */
export type TangentOptions = {
  /** Half-width (deg) of the longitude window around each model tangent. */
  windowDeg: number;
  /** Gaussian kernel σ (deg) of the longitude profile (0.25–0.5° is usual). */
  kernelDeg: number;
  /** Only sources with |b| below this (deg). */
  maxAbsBDeg: number;
  /** If set, only sources with |v_LSR − v_terminal(l)| below this (km/s); a missing velocity is then left out. */
  nearTerminalKms: number | null;
  /** Fewest sources a class needs in the window. */
  minSources: number;
  resamples: number;
  seed: number;
  /** Pattern speed (km/s/kpc) for the age difference Δt, with whether it was fitted or assumed. */
  patternSpeedKmsKpc: number | null;
  patternSpeedLabel: 'fitted' | 'assumed' | null;
};

/** Defaults of {@link TangentOptions}. */
export const DEFAULT_TANGENT_OPTIONS: Readonly<TangentOptions> = Object.freeze({
  windowDeg: 6,
  kernelDeg: 0.3,
  maxAbsBDeg: 1,
  nearTerminalKms: null,
  minSources: 10,
  resamples: 2000,
  seed: 1,
  patternSpeedKmsKpc: null,
  patternSpeedLabel: null,
});

/** One class's tangent longitude (deg, [0, 360)) with its 95 % interval. */
export type TangentClass = { kind: TracerKind; n: number; tangentLDeg: number; ci95: Ci | null };

/**
 * Separation of two classes at one tangent. dlDeg = l_t(to) − l_t(from); dRKpc = R0 |cos l̄| Δl;
 * dnKpc across the arm, positive when `to` lies ahead of `from` in the sense of rotation;
 * dtMyr = Δn / (R (Ω − Ω_p) |sin ψ|), only with a pattern speed (an interpretation).
 */
export type TangentOffset = {
  from: TracerKind;
  to: TracerKind;
  dlDeg: number;
  dlCi95: Ci | null;
  dRKpc: number;
  dnKpc: number;
  dnCi95: Ci | null;
  dtMyr: number | null;
  dtCi95: Ci | null;
};

/** The tangent-point result for one tangent of one arm. */
export type ArmTangentResult = {
  arm: string;
  /** The model ridge's tangent longitude (deg, [0, 360)), the window's centre. */
  modelTangentLDeg: number;
  /** Galactocentric radius (kpc) and Sun distance (kpc) of the model ridge's tangent point. */
  RtKpc: number;
  distKpc: number;
  pitchDeg: number;
  classes: TangentClass[];
  offsets: TangentOffset[];
  /** The pattern speed behind dtMyr and whether it was fitted or assumed; null when none was given. */
  patternSpeedKmsKpc: number | null;
  patternSpeedLabel: 'fitted' | 'assumed' | null;
  /** Why a class or an interval is missing. */
  notes: string[];
};

/**
 * Pairs reported, `from` first: each gas class to each young class, then CO → HI and HII → OB.
 * The 'other' class gets a tangent longitude but no pair.
 */
const PAIRS: readonly [number, number][] = [
  [0, 2],
  [0, 3],
  [1, 2],
  [1, 3],
  [1, 0],
  [2, 3],
];

function resolveOptions(options: Partial<TangentOptions>): TangentOptions {
  const o = { ...DEFAULT_TANGENT_OPTIONS, ...options };
  const bad = (what: string) => new RangeError(`tangentOffsets: ${what}`);
  if (!(o.windowDeg > 0 && o.windowDeg <= 45))
    throw bad(`windowDeg = ${o.windowDeg} must lie in (0, 45]`);
  if (!(o.kernelDeg > 0 && o.kernelDeg <= o.windowDeg / 4))
    throw bad(`kernelDeg = ${o.kernelDeg} must be positive and at most windowDeg / 4`);
  if (!(o.maxAbsBDeg > 0)) throw bad(`maxAbsBDeg = ${o.maxAbsBDeg} must be positive`);
  if (o.nearTerminalKms !== null && !(o.nearTerminalKms > 0))
    throw bad(`nearTerminalKms = ${o.nearTerminalKms} must be positive or null`);
  if (!(Number.isInteger(o.minSources) && o.minSources >= 2))
    throw bad(`minSources = ${o.minSources} must be an integer ≥ 2`);
  if (!(Number.isInteger(o.resamples) && o.resamples >= 1))
    throw bad(`resamples = ${o.resamples} must be a positive integer`);
  if (!Number.isFinite(o.seed)) throw bad(`seed = ${o.seed} must be a finite number`);
  if ((o.patternSpeedKmsKpc === null) !== (o.patternSpeedLabel === null))
    throw bad(
      `patternSpeedKmsKpc = ${o.patternSpeedKmsKpc} and patternSpeedLabel = ${o.patternSpeedLabel} must be given together`,
    );
  if (o.patternSpeedKmsKpc !== null && !Number.isFinite(o.patternSpeedKmsKpc))
    throw bad(`patternSpeedKmsKpc = ${o.patternSpeedKmsKpc} must be finite`);
  return o;
}

function validateInput(input: TangentInput): void {
  const n = input.lDeg.length;
  for (const key of ['bDeg', 'vLsrKms', 'kind', 'cluster'] as const) {
    if (input[key].length !== n)
      throw new RangeError(
        `tangentOffsets: column ${key} has ${input[key].length} rows, lDeg has ${n}`,
      );
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(input.lDeg[i]))
      throw new RangeError(`tangentOffsets: lDeg of row ${i + 1} is ${input.lDeg[i]}`);
    if (!(input.bDeg[i] >= -90 && input.bDeg[i] <= 90))
      throw new RangeError(`tangentOffsets: bDeg of row ${i + 1} is ${input.bDeg[i]}`);
    if (input.kind[i] >= TRACER_KINDS.length)
      throw new RangeError(
        `tangentOffsets: kind of row ${i + 1} is ${input.kind[i]}, not a TRACER_KINDS index`,
      );
  }
}

/** Profile grid and kernel shared by every class at one tangent. */
type Grid = {
  x0: number;
  step: number;
  size: number;
  lo: number;
  hi: number;
  kernel: Float64Array;
};

function makeGrid(windowDeg: number, kernelDeg: number): Grid {
  const step = kernelDeg / GRID_PER_KERNEL;
  const reach = GRID_PER_KERNEL * KERNEL_REACH;
  const half = Math.ceil(windowDeg / step);
  const kernel = Float64Array.from({ length: 2 * reach + 1 }, (_, k) =>
    Math.exp(-0.5 * ((k - reach) / GRID_PER_KERNEL) ** 2),
  );
  // Sources within a kernel reach beyond the window still feed the profile inside it.
  return {
    x0: -(half + reach) * step,
    step,
    size: 2 * (half + reach) + 1,
    lo: reach,
    hi: reach + 2 * half,
    kernel,
  };
}

/**
 * Outer edge (deg, in the outward coordinate s) of a smoothed profile: the first crossing beyond
 * the peak of background + CAUSTIC_EDGE_LEVEL × (peak − background), NaN if there is none.
 */
function profileEdge(profile: Float64Array, g: Grid): number {
  let jp = g.lo;
  for (let j = g.lo + 1; j <= g.hi; j++) if (profile[j] > profile[jp]) jp = j;
  let peak = profile[jp];
  if (!(peak > 0)) return NaN;
  if (jp > g.lo && jp < g.hi) {
    const a = profile[jp - 1];
    const c = profile[jp + 1];
    const curv = a - 2 * peak + c;
    if (curv < 0) peak -= (c - a) ** 2 / (8 * curv);
  }
  let bg = Infinity;
  for (let j = jp + 1; j <= g.hi; j++) if (profile[j] < bg) bg = profile[j];
  if (!(bg < peak)) return NaN;
  const level = bg + CAUSTIC_EDGE_LEVEL * (peak - bg);
  for (let j = jp + 1; j <= g.hi; j++) {
    if (profile[j] < level) {
      const frac = (profile[j - 1] - level) / (profile[j - 1] - profile[j]);
      return g.x0 + (j - 1 + frac) * g.step;
    }
  }
  return NaN;
}

/** One class's sources at one tangent, linearly binned once. */
type ClassRows = { kind: number; bin: Int32Array; frac: Float64Array; cluster: Int32Array };

function smoothedEdge(
  rows: ClassRows,
  weights: Int32Array,
  g: Grid,
  hist: Float64Array,
  profile: Float64Array,
): number {
  hist.fill(0);
  for (let i = 0; i < rows.bin.length; i++) {
    const w = weights[rows.cluster[i]];
    if (w === 0) continue;
    const j = rows.bin[i];
    const f = rows.frac[i];
    hist[j] += w * (1 - f);
    hist[j + 1] += w * f;
  }
  // The profile is needed only inside the window; the kernel is symmetric.
  const kernel = g.kernel;
  const reach = kernel.length >> 1;
  for (let j = g.lo; j <= g.hi; j++) {
    let sum = hist[j] * kernel[reach];
    for (let k = 1; k <= reach; k++) sum += (hist[j - k] + hist[j + k]) * kernel[reach + k];
    profile[j] = sum;
  }
  return profileEdge(profile, g);
}

function percentileCi(values: Float64Array): Ci | null {
  const finite = values.filter(Number.isFinite).sort();
  if (finite.length === 0 || finite.length < (1 - MAX_FAILED_SHARE) * values.length) return null;
  const a = (1 - CI_LEVEL) / 2;
  return [quantileSorted(finite, a), quantileSorted(finite, 1 - a)];
}

/**
 * The tangent-point method for every inner-Galaxy tangent of every arm (see the module comment):
 * per class, its tangent longitude with a cluster-bootstrap 95 % interval; per pair of classes
 * present, Δl, ΔR, the across-arm Δn (positive = `to` ahead of `from` in the sense of rotation)
 * and, with a stated or fitted pattern speed, the age difference Δt. The Sun sits at
 * curve.R0Kpc. Throws RangeError naming the offending column, row or option, or for no arms.
 */
export function tangentOffsets(
  input: TangentInput,
  arms: ArmSpec[],
  curve: RotationCurve,
  options: Partial<TangentOptions> = {},
): ArmTangentResult[] {
  if (arms.length === 0) throw new RangeError('tangentOffsets: no arms given');
  validateInput(input);
  const o = resolveOptions(options);
  const R0 = curve.R0Kpc;
  const g = makeGrid(o.windowDeg, o.kernelDeg);
  const results: ArmTangentResult[] = [];
  let tangentIndex = 0;
  for (const arm of arms) {
    for (const t of armTangentLongitudes(arm, R0)) {
      results.push(oneTangent(input, arm, t, curve, o, g, deriveSeed(o.seed, tangentIndex)));
      tangentIndex++;
    }
  }
  return results;
}

function oneTangent(
  input: TangentInput,
  arm: ArmSpec,
  t: ArmTangent,
  curve: RotationCurve,
  o: TangentOptions,
  g: Grid,
  seed: number,
): ArmTangentResult {
  const R0 = curve.R0Kpc;
  // Outward coordinate s: beyond the tangent (where the density drops) is s > 0 in both quadrants.
  const outward = t.lDeg < 180 ? 1 : -1;
  const reachDeg = -g.x0;
  const notes: string[] = [];

  const clusterIds = new Map<number, number>();
  const perKind: { s: number[]; cluster: number[] }[] = TRACER_KINDS.map(() => ({
    s: [],
    cluster: [],
  }));
  for (let i = 0; i < input.lDeg.length; i++) {
    if (!(Math.abs(input.bDeg[i]) < o.maxAbsBDeg)) continue;
    const u = wrap180Deg(input.lDeg[i] - t.lDeg);
    if (Math.abs(u) >= reachDeg) continue;
    if (o.nearTerminalKms !== null) {
      const l = input.lDeg[i];
      const vTerminal = vLsrAtKms(l, 0, R0 * Math.cos(l * DEG), curve);
      if (!(Math.abs(input.vLsrKms[i] - vTerminal) < o.nearTerminalKms)) continue;
    }
    let c = clusterIds.get(input.cluster[i]);
    if (c === undefined) {
      c = clusterIds.size;
      clusterIds.set(input.cluster[i], c);
    }
    perKind[input.kind[i]].s.push(outward * u);
    perKind[input.kind[i]].cluster.push(c);
  }

  const classes: ClassRows[] = [];
  const counts: number[] = [];
  perKind.forEach((rows, kind) => {
    const inWindow = rows.s.filter((s) => Math.abs(s) <= o.windowDeg).length;
    if (inWindow === 0) return;
    if (inWindow < o.minSources) {
      notes.push(
        `${TRACER_KINDS[kind]}: ${inWindow} sources in the window, fewer than minSources = ${o.minSources}`,
      );
      return;
    }
    const bin = new Int32Array(rows.s.length);
    const frac = new Float64Array(rows.s.length);
    rows.s.forEach((s, i) => {
      const x = Math.min((s - g.x0) / g.step, g.size - 1 - 1e-9);
      bin[i] = Math.floor(x);
      frac[i] = x - bin[i];
    });
    classes.push({ kind, bin, frac, cluster: Int32Array.from(rows.cluster) });
    counts.push(inWindow);
  });

  const hist = new Float64Array(g.size);
  const profile = new Float64Array(g.size);
  const nc = clusterIds.size;
  const weights = new Int32Array(nc).fill(1);
  const point = classes.map((rows) => smoothedEdge(rows, weights, g, hist, profile));
  const kept = classes.flatMap((rows, k) => {
    if (Number.isFinite(point[k])) return [k];
    notes.push(
      `${TRACER_KINDS[rows.kind]}: the profile does not fall to its edge level within the window`,
    );
    return [];
  });

  const boot = classes.map(() => new Float64Array(o.resamples));
  const rng = makeRng(seed);
  for (let r = 0; r < o.resamples; r++) {
    weights.fill(0);
    for (let k = 0; k < nc; k++) weights[rng.int(nc)]++;
    for (const k of kept) boot[k][r] = smoothedEdge(classes[k], weights, g, hist, profile);
  }

  const lOf = (s: number) => t.lDeg + outward * s;
  const classResults: TangentClass[] = kept.map((k) => {
    const ci = percentileCi(boot[k].map(lOf));
    if (!ci)
      notes.push(
        `${TRACER_KINDS[classes[k].kind]}: too many resamples without an edge for an interval`,
      );
    return {
      kind: TRACER_KINDS[classes[k].kind],
      n: counts[k],
      tangentLDeg: wrap360Deg(lOf(point[k])),
      ci95: ci ? [wrap360Deg(ci[0]), wrap360Deg(ci[1])] : null,
    };
  });

  const slot = new Map(kept.map((k) => [classes[k].kind, k]));
  const nOf = (s: number) =>
    Number.isFinite(s) ? tangentNormalOffsetKpc(arm, R0, t, lOf(s)) : NaN;
  const nPoint = point.map(nOf);
  const nBoot = boot.map((b, k) => (kept.includes(k) ? b.map(nOf) : b));
  const sinPsi = Math.abs(Math.sin(t.pitchDeg * DEG));
  const dtOf = (dnKpc: number): number | null => {
    if (o.patternSpeedKmsKpc === null || sinPsi === 0) return null;
    const dt = delayMyr(dnKpc / (t.RKpc * sinPsi) / DEG, t.RKpc, curve, o.patternSpeedKmsKpc);
    return Number.isFinite(dt) ? dt : null;
  };
  const offsets: TangentOffset[] = [];
  for (const [fromKind, toKind] of PAIRS) {
    const a = slot.get(fromKind);
    const b = slot.get(toKind);
    if (a === undefined || b === undefined) continue;
    const dl = outward * (point[b] - point[a]);
    const dn = nPoint[b] - nPoint[a];
    const dlBoot = new Float64Array(o.resamples);
    const dnBoot = new Float64Array(o.resamples);
    const dtBoot = new Float64Array(o.resamples);
    for (let r = 0; r < o.resamples; r++) {
      dlBoot[r] = outward * (boot[b][r] - boot[a][r]);
      dnBoot[r] = nBoot[b][r] - nBoot[a][r];
      dtBoot[r] = dtOf(dnBoot[r]) ?? NaN;
    }
    const dt = dtOf(dn);
    offsets.push({
      from: TRACER_KINDS[fromKind],
      to: TRACER_KINDS[toKind],
      dlDeg: dl,
      dlCi95: percentileCi(dlBoot),
      dRKpc: R0 * Math.abs(Math.cos(lOf(0.5 * (point[a] + point[b])) * DEG)) * dl * DEG,
      dnKpc: dn,
      dnCi95: percentileCi(dnBoot),
      dtMyr: dt,
      dtCi95: dt === null ? null : percentileCi(dtBoot),
    });
  }

  return {
    arm: arm.name,
    modelTangentLDeg: t.lDeg,
    RtKpc: t.RKpc,
    distKpc: t.distKpc,
    pitchDeg: t.pitchDeg,
    classes: classResults,
    offsets,
    patternSpeedKmsKpc: o.patternSpeedKmsKpc,
    patternSpeedLabel: o.patternSpeedLabel,
    notes,
  };
}
