/**
 * The distance of each complex and how it was chosen (SCIENCE.md §4).
 *
 * Order of precedence:
 * 1. a distance set by hand wins ('override'; no interval);
 * 2. otherwise the kinematic distance of the complex's mean (l, b, v_LSR) on the settings' curve,
 *    with a Monte Carlo 68 % interval over v ~ N(v, σ_meas² + σ_stream²);
 *    - two roots: an independent distance of a member picks the root nearer to it
 *      (`resolveAmbiguity`; choice 'near'/'far', the reason says so); when there is none, or its
 *      error bar does not separate the roots, the latitude rule decides (the far root would put
 *      the complex more than 2.5 scale heights from the plane → near); else 'unresolved';
 *    - one root outside the solar circle: 'single'; beyond the terminal velocity: 'tangent';
 * 3. where no usable kinematic distance exists — no velocity, a forbidden velocity, or a
 *    kinematic distance that is unreliable (|l| or |l − 180°| < 15°, beyond terminal, near the
 *    tangent point) — an independent distance of the members is used as the distance itself
 *    ('independent', interval ± its error).
 * Complexes whose distance rests on an unreliable kinematic distance, or that have none, are
 * marked with an exclusion reason (see `./exclusions`), but keep the distance shown.
 */
import {
  KINEMATIC_FLAG_BITS,
  flagsFromBits,
  kinematicDistancesBulk,
  monteCarloDistancesBulk,
  resolveAmbiguity,
  type AmbiguityResolution,
  type MonteCarloColumns,
} from '@/lib/astro/kinematic-distance';
import { deriveSeed } from '@/lib/stats/rng';
import { VELOCITY_SOURCE, type ComplexInputs } from './complex-inputs';
import {
  isUnreliableLongitude,
  UNRELIABLE_LONGITUDE_EXCLUSION_DEG,
  type ExclusionReason,
} from './exclusions';
import type { DistanceChoice, OrderingComplex, OrderingSettings } from './types';

/** Distance of one complex: kpc (NaN where none), choice, reason in words, flags and exclusion. */
export type DistanceDecision = {
  distKpc: number;
  loKpc: number;
  hiKpc: number;
  choice: DistanceChoice;
  reason: string;
  flags: string[];
  exclusion: ExclusionReason | null;
};

/** Kinematic solution of one complex as {@link decideDistance} needs it (kpc, NaN where none). */
export type KinematicInput = {
  nearKpc: number;
  farKpc: number;
  tangentKpc: number;
  flagBits: number;
  nearLoKpc: number;
  nearHiKpc: number;
  farLoKpc: number;
  farHiKpc: number;
};

/** Everything {@link decideDistance} looks at for one complex. */
export type DistanceInput = {
  lDeg: number;
  bDeg: number;
  vLsrKms: number;
  velocityMembers: number;
  velocitySource: number;
  indepDistKpc: number;
  indepErrKpc: number;
  indepMembers: number;
  override: { distKpc: number; note?: string } | null;
  kinematic: KinematicInput;
  scaleHeightKpc: number;
};

const MC_CHUNK = 512;

function fmt(x: number, digits = 2): string {
  return x.toFixed(digits);
}

function velocityWords(d: DistanceInput): string {
  const v = `v_LSR = ${fmt(d.vLsrKms, 1)} km/s`;
  const n = d.velocityMembers;
  const s = n === 1 ? '' : 's';
  if (d.velocitySource === VELOCITY_SOURCE.gas) return `${v} from ${n} gas member${s}`;
  if (d.velocitySource === VELOCITY_SOURCE.allFallback)
    return `${v} from ${n} member${s} (no gas member has a velocity, so all members were used)`;
  return `${v} from ${n} member${s}`;
}

function independentWords(d: DistanceInput): string {
  const err = Number.isFinite(d.indepErrKpc) ? ` ± ${fmt(d.indepErrKpc)}` : '';
  const s = d.indepMembers === 1 ? '' : 's';
  return `independent distance ${fmt(d.indepDistKpc)}${err} kpc of ${d.indepMembers} member${s}`;
}

function independentDecision(d: DistanceInput, why: string, flags: string[]): DistanceDecision {
  const e = d.indepErrKpc;
  return {
    distKpc: d.indepDistKpc,
    loKpc: Number.isFinite(e) ? Math.max(0, d.indepDistKpc - e) : NaN,
    hiKpc: Number.isFinite(e) ? d.indepDistKpc + e : NaN,
    choice: 'independent',
    reason: `${why}; ${independentWords(d)} used as the distance`,
    flags,
    exclusion: null,
  };
}

function kinematicProblem(d: DistanceInput): { reason: ExclusionReason; words: string } | null {
  const bits = d.kinematic.flagBits;
  if (isUnreliableLongitude(d.lDeg))
    return {
      reason: 'unreliable-longitude',
      words: `l = ${fmt(d.lDeg)}° is within ${UNRELIABLE_LONGITUDE_EXCLUSION_DEG}° of l = 0° or 180°`,
    };
  if (bits & KINEMATIC_FLAG_BITS['beyond-terminal'])
    return { reason: 'beyond-terminal', words: 'the velocity is beyond the terminal velocity' };
  if (bits & KINEMATIC_FLAG_BITS['near-tangent'])
    return {
      reason: 'near-tangent',
      words: 'the velocity is within streaming motions of the terminal velocity',
    };
  if (bits & KINEMATIC_FLAG_BITS['no-solution'])
    return { reason: 'no-distance', words: 'no kinematic distance exists for this velocity' };
  return null;
}

function interval(choice: AmbiguityResolution['choice'], k: KinematicInput): [number, number] {
  if (choice === 'near') return [k.nearLoKpc, k.nearHiKpc];
  if (choice === 'far' || choice === 'single') return [k.farLoKpc, k.farHiKpc];
  if (choice === 'tangent') return [k.nearLoKpc, k.farHiKpc];
  return [NaN, NaN];
}

function ambiguity(d: DistanceInput): AmbiguityResolution {
  const k = d.kinematic;
  const near = Number.isNaN(k.nearKpc) ? null : k.nearKpc;
  const far = Number.isNaN(k.farKpc) ? null : k.farKpc;
  const base = { nearKpc: near, farKpc: far, bDeg: d.bDeg, scaleHeightKpc: d.scaleHeightKpc };
  if (!Number.isFinite(d.indepDistKpc)) return resolveAmbiguity(base);
  const byDistance = resolveAmbiguity({
    ...base,
    independentDistKpc: d.indepDistKpc,
    independentErrKpc: Number.isFinite(d.indepErrKpc) ? d.indepErrKpc : undefined,
  });
  if (byDistance.choice !== 'unresolved') return byDistance;
  const byLatitude = resolveAmbiguity(base);
  return { ...byLatitude, reason: `${byDistance.reason}; ${byLatitude.reason}` };
}

/**
 * Chooses the distance of one complex (see the module comment for the rules). Pure: all inputs
 * are given, including the complex's kinematic roots and Monte Carlo intervals.
 */
export function decideDistance(d: DistanceInput): DistanceDecision {
  const k = d.kinematic;
  const flags: string[] = flagsFromBits(k.flagBits);
  if (isUnreliableLongitude(d.lDeg))
    flags.push(`within-${UNRELIABLE_LONGITUDE_EXCLUSION_DEG}deg-of-l0-or-l180`);
  if (d.override) {
    const note = d.override.note ? `: ${d.override.note}` : '';
    return {
      distKpc: d.override.distKpc,
      loKpc: NaN,
      hiKpc: NaN,
      choice: 'override',
      reason: `distance set by hand${note}`,
      flags,
      exclusion: null,
    };
  }
  const hasIndependent = Number.isFinite(d.indepDistKpc);
  if (d.velocitySource === VELOCITY_SOURCE.none) {
    if (hasIndependent) return independentDecision(d, 'no member has a velocity', flags);
    return unresolved(
      'no member has a velocity and no member has an independent distance',
      flags,
      'no-velocity',
    );
  }
  const problem = kinematicProblem(d);
  if (problem && hasIndependent)
    return independentDecision(d, `${velocityWords(d)}; ${problem.words}`, flags);
  if (problem?.reason === 'no-distance')
    return unresolved(`${velocityWords(d)}; ${problem.words}`, flags, 'no-distance');
  if (problem?.reason === 'beyond-terminal') {
    return {
      distKpc: k.tangentKpc,
      loKpc: k.nearLoKpc,
      hiKpc: k.farHiKpc,
      choice: 'tangent',
      reason: `${velocityWords(d)}; beyond the terminal velocity, placed at the tangent point`,
      flags,
      exclusion: 'beyond-terminal',
    };
  }
  const res = ambiguity(d);
  const reason = `${velocityWords(d)}; ${res.reason}`;
  if (res.choice === 'unresolved' || res.distKpc === null)
    return unresolved(reason, flags, problem?.reason ?? 'unresolved-near-far');
  const [lo, hi] = interval(res.choice, k);
  return {
    distKpc: res.distKpc,
    loKpc: lo,
    hiKpc: hi,
    choice: res.choice,
    reason: problem ? `${reason}; ${problem.words}` : reason,
    flags,
    exclusion: problem?.reason ?? null,
  };
}

function unresolved(reason: string, flags: string[], exclusion: ExclusionReason): DistanceDecision {
  return { distKpc: NaN, loKpc: NaN, hiKpc: NaN, choice: 'unresolved', reason, flags, exclusion };
}

/**
 * Kinematic roots and Monte Carlo intervals for every complex: the roots of the mean velocity
 * (tabulated solver of `kinematicDistancesBulk`) and 16th/84th percentiles over `mcDraws` draws
 * of v ~ N(v, σ_meas² + σ_stream²), run in chunks of 512 complexes whose seeds derive from the
 * settings' seed, so the result is reproducible. `onChunk(done)` reports complexes finished.
 */
export function kinematicColumns(
  inputs: ComplexInputs,
  settings: OrderingSettings,
  onChunk: (done: number) => void,
): {
  nearKpc: Float64Array;
  farKpc: Float64Array;
  tangentKpc: Float64Array;
  flags: Uint16Array;
  mc: MonteCarloColumns;
} {
  const n = inputs.lDeg.length;
  const kd = kinematicDistancesBulk(inputs.lDeg, inputs.bDeg, inputs.vLsrKms, settings.curve);
  const f = () => new Float64Array(n);
  const mc: MonteCarloColumns = {
    nearMedianKpc: f(),
    nearLoKpc: f(),
    nearHiKpc: f(),
    nearFraction: f(),
    farMedianKpc: f(),
    farLoKpc: f(),
    farHiKpc: f(),
    farFraction: f(),
  };
  for (let from = 0, chunk = 0; from < n; from += MC_CHUNK, chunk++) {
    const to = Math.min(n, from + MC_CHUNK);
    const part = monteCarloDistancesBulk(
      inputs.lDeg.subarray(from, to),
      inputs.bDeg.subarray(from, to),
      inputs.vLsrKms.subarray(from, to),
      inputs.sigmaMeasKms.subarray(from, to),
      settings.curve,
      {
        draws: settings.mcDraws,
        sigmaStreamKms: settings.sigmaStreamKms,
        seed: deriveSeed(settings.seed, chunk),
      },
    );
    for (const key of Object.keys(mc) as (keyof MonteCarloColumns)[]) mc[key].set(part[key], from);
    onChunk(to);
  }
  return { nearKpc: kd.nearKpc, farKpc: kd.farKpc, tangentKpc: kd.tangentKpc, flags: kd.flags, mc };
}

/** Decides the distance of every complex from its inputs, kinematic columns and override. */
export function decideDistances(
  complexes: OrderingComplex[],
  inputs: ComplexInputs,
  kin: ReturnType<typeof kinematicColumns>,
  scaleHeightKpc: number,
): DistanceDecision[] {
  return complexes.map((cx, c) =>
    decideDistance({
      lDeg: inputs.lDeg[c],
      bDeg: inputs.bDeg[c],
      vLsrKms: inputs.vLsrKms[c],
      velocityMembers: inputs.velocityMembers[c],
      velocitySource: inputs.velocitySource[c],
      indepDistKpc: inputs.indepDistKpc[c],
      indepErrKpc: inputs.indepErrKpc[c],
      indepMembers: inputs.indepMembers[c],
      override: cx.distanceOverride ?? null,
      scaleHeightKpc,
      kinematic: {
        nearKpc: kin.nearKpc[c],
        farKpc: kin.farKpc[c],
        tangentKpc: kin.tangentKpc[c],
        flagBits: kin.flags[c],
        nearLoKpc: kin.mc.nearLoKpc[c],
        nearHiKpc: kin.mc.nearHiKpc[c],
        farLoKpc: kin.mc.farLoKpc[c],
        farHiKpc: kin.mc.farHiKpc[c],
      },
    }),
  );
}
