/**
 * runOrderingAnalysis: the ordering of gas and young stars across spiral arms (docs/methods.md,
 * "Ordering across the arms"), as one pure function. Every offset is measured in the sense of
 * Galactic rotation (positive ahead of the ridge); upstream and downstream appear only in the
 * interpretation, from the fitted pattern speed or a stated one. The steps live in their own
 * modules; this one wires them together, decides which complexes are used and shapes the result.
 */
import {
  KINEMATIC_FLAG_BITS,
  flagsFromBits,
  kinematicDistancesBulk,
} from '@/lib/astro/kinematic-distance';
import { ksTwoSample } from '@/lib/stats/ks';
import { deriveSeed } from '@/lib/stats/rng';
import { median } from '@/lib/stats/summary';
import { classPlan, memberCounts, planGroups, summarisePlan } from './class-offsets';
import { complexInputs, VELOCITY_SOURCE } from './complex-inputs';
import { conventionsText } from './conventions';
import { drawDistances, velocitySigmaKms } from './distance-draws';
import { drawQuantiles, offsetsOfDraws } from './draw-offsets';
import { countReasons, type ExclusionReason } from './exclusions';
import { gasToStarsColumns } from './gas-to-stars';
import { headlineOf, interpretationOf } from './headline';
import { intraComplexSummary } from './intra-complex';
import { lvOffsets } from './lv-offsets';
import { flattenMembers, TRACER_KINDS } from './members';
import { nestedReplicates, type DrawMatrices } from './nested-bootstrap';
import { fitPatternSpeed } from './pattern-fit';
import { placeComplexes, placePoints } from './placement';
import { radialPlan, radialSummaries } from './radial-phase';
import { validateOverrides, validateSettings } from './settings';
import { tangentOffsets } from './tangents';
import type {
  ComplexRow,
  DistanceChoice,
  OrderingComplex,
  OrderingResult,
  OrderingSettings,
  PatternFitSummary,
} from './types';
import { warningsFor } from './warnings';

/** Seed tags: each statistic draws from its own stream derived from the settings' seed. */
const SEED = { draws: 10, nested: 20, intra: 30, intraTest: 31, tangents: 40, lv: 50 } as const;
/** A complex counts for its arm when at least this share of its draws falls on it. */
export const MIN_ON_ARM_SHARE = 0.5;
/** Width (kpc) of the rings of the pattern-speed fit. */
export const RING_WIDTH_KPC = 1;
/** Tangent-point settings (docs/methods.md, "Tangent points"). */
export const TANGENT_DEFAULTS = { windowDeg: 6, kernelDeg: 0.3, maxAbsBDeg: 1, minSources: 10 };

function nullable(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

function choiceOf(
  method: string,
  pNear: number,
  tangentShare: number,
  excluded: boolean,
): DistanceChoice {
  if (method === 'override') return 'override';
  if (method === 'independent') return 'independent';
  if (method === 'none' || excluded) return 'unresolved';
  if (tangentShare > 0.5) return 'tangent';
  if (!(pNear === pNear)) return 'single';
  return pNear >= 0.5 ? 'near' : 'far';
}

/**
 * Runs the ordering analysis on `complexes` with `settings` (see `./types` for units and the
 * result shape, and `conventionsText` for the frame and signs). `onProgress` receives the done
 * fraction in [0, 1]. Throws RangeError for invalid settings or members, naming the value.
 */
export function runOrderingAnalysis(
  complexes: OrderingComplex[],
  settings: OrderingSettings,
  onProgress?: (f: number) => void,
): OrderingResult {
  const progress = (f: number) => onProgress?.(Math.min(1, Math.max(0, f)));
  validateSettings(settings);
  validateOverrides(complexes);
  const cols = flattenMembers(complexes);
  const n = complexes.length;
  const { curve, arms, resamples, seed, mcDraws: D } = settings;
  const R0 = curve.R0Kpc;
  progress(0.02);

  const inputs = complexInputs(cols, n, settings.velocityFrom);
  const sigmaKms = velocitySigmaKms(inputs, settings.sigmaStreamKms);
  const nominal = kinematicDistancesBulk(inputs.lDeg, inputs.bDeg, inputs.vLsrKms, curve, sigmaKms);
  const draws = drawDistances(
    inputs,
    complexes.map((c) => c.distanceOverride?.distKpc ?? null),
    {
      curve,
      R0ErrKpc: settings.R0ErrKpc,
      theta0ErrKms: settings.theta0ErrKms,
      sigmaStreamKms: settings.sigmaStreamKms,
      scaleHeightKpc: settings.scaleHeightKpc,
      nearFar: settings.nearFar,
      draws: D,
      seed: deriveSeed(seed, SEED.draws),
    },
    (j) => progress(0.02 + (0.4 * j) / D),
  );
  // Reasons in the order of EXCLUSION_REASONS: the nominal velocity's tangent flags come before
  // what the draws could not resolve.
  const exclusion: (ExclusionReason | null)[] = draws.exclusion.map((r, c) => {
    if (draws.method[c] !== 'kinematic') return r;
    if (nominal.flags[c] & KINEMATIC_FLAG_BITS['beyond-terminal']) return 'beyond-terminal';
    if (nominal.flags[c] & KINEMATIC_FLAG_BITS['near-tangent']) return 'near-tangent';
    return r;
  });
  const offs = offsetsOfDraws(inputs.lDeg, inputs.bDeg, draws, arms, settings.armWidthKpc);
  for (let c = 0; c < n; c++)
    if (exclusion[c] === null && (offs.arm[c] < 0 || offs.onArmShare[c] < MIN_ON_ARM_SHARE))
      exclusion[c] = 'off-arm';
  const used = Int32Array.from(exclusion.flatMap((r, c) => (r === null ? [c] : [])));
  progress(0.55);

  const scratch = new Float64Array(D);
  const onArmR = Float64Array.from(offs.RKpc, (R, k) =>
    offs.perpKpc[k] === offs.perpKpc[k] ? R : NaN,
  );
  const medianR = Float64Array.from(
    { length: n },
    (_, c) => drawQuantiles(onArmR, c, D, [0.5], scratch)[0],
  );
  const distQ = Array.from({ length: n }, (_, c) =>
    drawQuantiles(draws.distKpc, c, D, [0.5, 0.16, 0.84, 0.025, 0.975], scratch),
  );
  const perpQ = Array.from({ length: n }, (_, c) =>
    drawQuantiles(offs.perpKpc, c, D, [0.5, 0.025, 0.975], scratch),
  );
  const azQ = Float64Array.from(
    { length: n },
    (_, c) => drawQuantiles(offs.azimuthDeg, c, D, [0.5], scratch)[0],
  );

  const matrices: DrawMatrices = { count: n, draws: D, values: [offs.perpKpc, offs.azimuthDeg] };
  const counts = memberCounts(cols, n);
  const mainPlan = classPlan(counts, used);
  const armPlans = arms.map((_, a) =>
    classPlan(
      counts,
      used.filter((c) => offs.arm[c] === a),
    ),
  );
  const rings = radialPlan(medianR, used, counts, RING_WIDTH_KPC);
  const groups = [
    ...planGroups(mainPlan),
    ...armPlans.flatMap(planGroups),
    ...rings.gas,
    ...rings.young,
  ];
  const reps = nestedReplicates(matrices, used, groups, resamples, deriveSeed(seed, SEED.nested));
  progress(0.8);
  let at = 0;
  const take = (k: number) => reps.slice(at, (at += k));
  const main = summarisePlan(matrices, mainPlan, take(planGroups(mainPlan).length));
  const perArm = arms.map((arm, a) => {
    const plan = armPlans[a];
    const s = summarisePlan(matrices, plan, take(planGroups(plan).length));
    return { arm: arm.name, n: used.filter((c) => offs.arm[c] === a).length, ...s };
  });
  const ringGas = take(rings.gas.length);
  const ringYoung = take(rings.young.length);
  const radial = radialSummaries(matrices, rings, ringGas, ringYoung, medianR, curve);
  const fit = fitPatternSpeed(radial.fitBins, curve);
  fit.usedBins.forEach((u, i) => {
    if (u) radial.bins[radial.fitIndex[i]].fitted = true;
  });
  const patternFit: PatternFitSummary | null =
    fit.constrained || fit.timescaleMyr !== null
      ? {
          patternSpeedKmsKpc: fit.patternSpeedKmsKpc,
          patternSpeedCi95: fit.patternSpeedCi95,
          timescaleMyr: fit.timescaleMyr,
          timescaleCi95: fit.timescaleCi95,
          corotationKpc: fit.corotationKpc,
          corotationCi95: fit.corotationCi95,
          binsUsed: fit.binsUsed,
          constrained: fit.constrained,
          reason: fit.reason,
          notes: fit.notes,
          line: fit.line,
        }
      : null;
  const interpretation = interpretationOf(
    patternFit,
    settings.patternSpeedKmsKpc,
    Array.from(used, (c) => medianR[c]).filter((R) => R > 0),
    curve,
  );
  progress(0.85);

  const cluster = cols.complexIndex;
  const tangents = tangentOffsets(
    { lDeg: cols.lDeg, bDeg: cols.bDeg, vLsrKms: cols.vLsrKms, kind: cols.kind, cluster },
    arms,
    curve,
    {
      ...TANGENT_DEFAULTS,
      nearTerminalKms: settings.tangentNearTerminalKms,
      resamples,
      seed: deriveSeed(seed, SEED.tangents),
      patternSpeedKmsKpc: interpretation.patternSpeedKmsKpc,
      patternSpeedLabel: interpretation.source,
    },
  );
  const lv = lvOffsets(
    { lDeg: cols.lDeg, bDeg: cols.bDeg, vLsrKms: cols.vLsrKms, kind: cols.kind, cluster },
    arms,
    curve,
    { resamples, seed: deriveSeed(seed, SEED.lv) },
  );
  progress(0.92);

  const medDist = Float64Array.from(distQ, (q) => q[0]);
  const place = placeComplexes(inputs.lDeg, inputs.bDeg, medDist, arms, R0);
  const memberDist = Float64Array.from(cols.complexIndex, (c) => medDist[c]);
  const members = placePoints(cols.lDeg, cols.bDeg, memberDist, R0);
  const gts = gasToStarsColumns(
    cols.start,
    cols.kind,
    members.xKpc,
    members.yKpc,
    place.xKpc,
    place.yKpc,
    place.normalX,
    place.normalY,
    R0,
  );
  const intraComplex = intraComplexSummary(
    gts.acrossKpc,
    gts.alongKpc,
    medDist,
    used,
    settings.linkRadiusArcsec,
    resamples,
    deriveSeed(seed, SEED.intra),
    deriveSeed(seed, SEED.intraTest),
  );
  const gasOffsets = Array.from(used)
    .filter((c) => counts.gas[c] > 0)
    .map((c) => perpQ[c][0]);
  const youngOffsets = Array.from(used)
    .filter((c) => counts.young[c] > 0)
    .map((c) => perpQ[c][0]);
  const ks =
    gasOffsets.length > 0 && youngOffsets.length > 0 ? ksTwoSample(gasOffsets, youngOffsets) : null;

  const reasons = countReasons(exclusion);
  const rows: ComplexRow[] = complexes.map((cx, c) => {
    const q = distQ[c];
    const p = perpQ[c];
    const excluded = exclusion[c] !== null;
    const a = offs.arm[c];
    return {
      id: cx.id,
      lDeg: inputs.lDeg[c],
      bDeg: inputs.bDeg[c],
      vLsrKms: nullable(inputs.vLsrKms[c]),
      distKpc: nullable(q[0]),
      distLoKpc: nullable(q[1]),
      distHiKpc: nullable(q[2]),
      distCi95: Number.isFinite(q[3]) ? [q[3], q[4]] : null,
      pNear: nullable(draws.pNear[c]),
      choice: choiceOf(
        draws.method[c],
        draws.pNear[c],
        draws.tangentShare[c],
        draws.method[c] === 'kinematic' && draws.validShare[c] < 0.5,
      ),
      reason: distanceWords(
        draws.method[c],
        draws.pNear[c],
        draws.validShare[c],
        settings.nearFar,
        cx.distanceOverride?.note,
      ),
      flags: flagsFromBits(nominal.flags[c]),
      xKpc: nullable(place.xKpc[c]),
      yKpc: nullable(place.yKpc[c]),
      RKpc: nullable(medianR[c]),
      betaDeg: nullable(place.betaDeg[c]),
      arm: a >= 0 ? arms[a].name : null,
      onArmShare: offs.onArmShare[c],
      perpOffsetKpc: nullable(p[0]),
      perpCi95: Number.isFinite(p[1]) ? [p[1], p[2]] : null,
      azimuthOffsetDeg: nullable(azQ[c]),
      intraAcrossKpc: nullable(gts.acrossKpc[c]),
      used: !excluded,
      excludedBecause: exclusion[c],
    };
  });
  const sources: OrderingResult['sources'] = [];
  for (let i = 0; i < cols.count; i++) {
    if (!(members.xKpc[i] === members.xKpc[i])) continue;
    const c = cols.complexIndex[i];
    sources.push({
      complexId: complexes[c].id,
      kind: TRACER_KINDS[cols.kind[i]],
      xKpc: members.xKpc[i],
      yKpc: members.yKpc[i],
      perpOffsetKpc: nullable(perpQ[c][0]),
    });
  }
  const widths = Array.from(used, (c) => distQ[c][2] - distQ[c][1]).filter((w) => w >= 0);
  const constantsWithoutError = settings.R0ErrKpc === 0 && settings.theta0ErrKms === 0;
  const warnings = warningsFor({
    complexes: n,
    used: used.length,
    reasons,
    velocityFallback: inputs.velocitySource.filter((s) => s === VELOCITY_SOURCE.allFallback).length,
    independentInsteadOfKinematic: draws.method.filter((m) => m === 'independent').length,
    ambiguousNearFar: Array.from(used).filter((c) => draws.pNear[c] > 0.2 && draws.pNear[c] < 0.8)
      .length,
    gasComplexes: mainPlan.gasPerp.complexes.length,
    youngComplexes: mainPlan.youngPerp.complexes.length,
    constantsWithoutError,
    armsR0Kpc: settings.armsR0Kpc,
    curveR0Kpc: R0,
  });
  const lvMasked: Record<string, number> = { ...lv.masked };
  const body: Omit<OrderingResult, 'headline'> = {
    classes: main.classes,
    youngMinusGas: main.youngMinusGas,
    perArm,
    radialBins: radial.bins,
    patternFit,
    patternFitReason: patternFit ? null : fit.reason,
    interpretation,
    tangents,
    lvOffsets: lv.rows,
    lvMasked,
    intraComplex,
    ks: ks ? { d: ks.d, pValue: ks.pValue } : null,
    distances: {
      draws: D,
      nearFar: settings.nearFar,
      sigmaStreamKms: settings.sigmaStreamKms,
      R0Kpc: R0,
      R0ErrKpc: settings.R0ErrKpc,
      theta0Kms: curve.theta0Kms,
      theta0ErrKms: settings.theta0ErrKms,
      medianCi68WidthKpc: widths.length > 0 ? median(widths) : null,
    },
    exclusions: { complexes: n, used: used.length, reasons },
    warnings,
    complexes: rows,
    sources,
    conventions: conventionsText({ R0Kpc: R0, resamples, seed, draws: D }),
  };
  progress(1);
  return { headline: headlineOf(body, used.length, D), ...body };
}

function distanceWords(
  method: string,
  pNear: number,
  validShare: number,
  rule: string,
  note: string | undefined,
): string {
  if (method === 'override') return `distance set by hand${note ? `: ${note}` : ''}`;
  if (method === 'independent') return "a member's independent distance, drawn with its error";
  if (method === 'none') return 'no usable velocity or independent distance';
  const valid = `${Math.round(validShare * 100)} % of the draws have a distance`;
  if (!(pNear === pNear))
    return `kinematic distance, one root (outside the solar circle); ${valid}`;
  return `kinematic distance, near in ${Math.round(pNear * 100)} % of the two-root draws (${rule} rule); ${valid}`;
}
