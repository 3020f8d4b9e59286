/**
 * runOrderingAnalysis: distances, placement against the arms and the ordering statistics of a
 * set of complexes (SCIENCE.md §4–6), as one pure function. The steps live in their own modules;
 * this one wires them together, decides which complexes are used, and shapes the result.
 */
import { angularSpeedKmsKpc, corotationRadiusKpc } from '@/lib/astro/pattern-speed';
import { deriveSeed } from '@/lib/stats/rng';
import { median } from '@/lib/stats/summary';
import { classSummaries, type ClassInputs } from './class-offsets';
import { complexInputs, VELOCITY_SOURCE } from './complex-inputs';
import { conventionsText } from './conventions';
import { delaySummary } from './delay';
import { decideDistances, kinematicColumns, type DistanceDecision } from './distance';
import { countReasons, type ExclusionReason } from './exclusions';
import { flowSigns } from './flow-sign';
import { gasToStarsColumns } from './gas-to-stars';
import { flattenMembers, TRACER_KINDS } from './members';
import { centroidOffsetKs, gasToStarsSummary, signedGasToStars } from './ordering-test';
import {
  offsetsFromAssignedArms,
  placeComplexes,
  placePoints,
  type ComplexPlacement,
} from './placement';
import { radialBins } from './radial-bins';
import { validateOverrides, validateSettings } from './settings';
import type { ComplexRow, OrderingComplex, OrderingResult, OrderingSettings } from './types';
import { warningsFor } from './warnings';

/** Seed tags: each statistic draws from its own stream derived from the settings' seed. */
const SEED = {
  classes: 100,
  gasToStars: 200,
  signFlip: 201,
  delay: 202,
  perArm: 1000,
  radial: 5000,
} as const;

function nullable(x: number): number | null {
  return x === x ? x : null;
}

function offArm(p: ComplexPlacement, c: number, armWidthKpc: number): boolean {
  return !p.withinRange[c] || !(Math.abs(p.perpOffsetKpc[c]) <= armWidthKpc);
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
  const { curve, arms, patternSpeedKmsKpc: omegaP, resamples, seed } = settings;
  const R0 = curve.R0Kpc;
  progress(0.02);

  const inputs = complexInputs(cols, n, settings.velocityFrom);
  const kin = kinematicColumns(inputs, settings, (done) =>
    progress(0.02 + (0.5 * done) / Math.max(1, n)),
  );
  const decisions: DistanceDecision[] = decideDistances(
    complexes,
    inputs,
    kin,
    settings.scaleHeightKpc,
  );
  const distKpc = Float64Array.from(decisions, (d) => d.distKpc);
  const loKpc = Float64Array.from(decisions, (d) => d.loKpc);
  const hiKpc = Float64Array.from(decisions, (d) => d.hiKpc);

  const place = placeComplexes(inputs.lDeg, inputs.bDeg, distKpc, arms, R0);
  const exclusion: (ExclusionReason | null)[] = decisions.map((d, c) =>
    d.exclusion === null && place.armIndex[c] >= 0 && offArm(place, c, settings.armWidthKpc)
      ? 'off-arm'
      : d.exclusion,
  );
  const used = Uint8Array.from(exclusion, (r) => (r === null ? 1 : 0));
  progress(0.6);

  const memberDist = Float64Array.from(cols.complexIndex, (c) => distKpc[c]);
  const members = placePoints(cols.lDeg, cols.bDeg, memberDist, R0);
  const memberArm = Int32Array.from(cols.complexIndex, (c) => place.armIndex[c]);
  const memberOffsets = offsetsFromAssignedArms(members.xKpc, members.yKpc, memberArm, arms, R0);
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
  const flow = flowSigns(inputs.lDeg, inputs.bDeg, distKpc, loKpc, hiKpc, curve, omegaP);
  progress(0.7);

  const kindsPresent = TRACER_KINDS.map((_, k) => k).filter((k) => cols.kind.includes(k));
  const classInputs: ClassInputs = {
    memberComplex: cols.complexIndex,
    memberKind: cols.kind,
    memberPerpKpc: memberOffsets.perpOffsetKpc,
    memberAzimuthDeg: memberOffsets.azimuthOffsetDeg,
    used,
    flowSign: flow,
  };
  const classes = classSummaries(classInputs, kindsPresent, resamples, (k) =>
    deriveSeed(seed, SEED.classes + k),
  );
  progress(0.8);
  const signed = signedGasToStars(gts.acrossKpc, gts.alongKpc, used, flow);
  const gasToStars = gasToStarsSummary(
    signed,
    resamples,
    deriveSeed(seed, SEED.gasToStars),
    deriveSeed(seed, SEED.signFlip),
  );
  const ks = centroidOffsetKs(cols.start, cols.kind, memberOffsets.perpOffsetKpc, used, flow);
  const delay = delaySummary(
    gts.dBetaDeg,
    place.RKpc,
    used,
    flow,
    curve,
    omegaP,
    resamples,
    deriveSeed(seed, SEED.delay),
  );
  progress(0.85);
  const perArm = arms.map((arm, a) => {
    const onArm = (c: number) => place.armIndex[c] === a;
    const armClasses = classSummaries(
      classInputs,
      kindsPresent,
      resamples,
      (k) => deriveSeed(seed, SEED.perArm + 10 * a + k),
      onArm,
    );
    const across: number[] = [];
    let count = 0;
    for (let c = 0; c < n; c++) if (used[c] && onArm(c)) count++;
    for (let k = 0; k < signed.complex.length; k++)
      if (onArm(signed.complex[k])) across.push(signed.acrossKpc[k]);
    return {
      arm: arm.name,
      n: count,
      classes: armClasses.map(({ kind, n: nk, medianOffsetKpc, ci95 }) => ({
        kind,
        n: nk,
        medianOffsetKpc,
        ci95,
      })),
      gasToStarsMedianKpc: across.length > 0 ? median(across) : null,
    };
  });
  progress(0.95);
  const bins = radialBins(gts.acrossKpc, place.RKpc, used, curve, omegaP, resamples, (b) =>
    deriveSeed(seed, SEED.radial + b),
  );
  const corotationKpc = corotationRadiusKpc(curve, omegaP);

  const reasons = countReasons(exclusion);
  let usedCount = 0;
  let straddling = 0;
  for (let c = 0; c < n; c++) {
    usedCount += used[c];
    if (used[c] && flow[c] === 0) straddling++;
  }
  const rows: ComplexRow[] = complexes.map((cx, c) => {
    const d = decisions[c];
    const placed = place.armIndex[c] >= 0;
    const flags = [...d.flags];
    if (used[c] && flow[c] === 0) flags.push('straddles-corotation');
    return {
      id: cx.id,
      lDeg: inputs.lDeg[c],
      bDeg: inputs.bDeg[c],
      vLsrKms: nullable(inputs.vLsrKms[c]),
      distKpc: nullable(d.distKpc),
      distLoKpc: nullable(d.loKpc),
      distHiKpc: nullable(d.hiKpc),
      choice: d.choice,
      reason:
        exclusion[c] === 'off-arm'
          ? `${d.reason}; ${offArmWords(place, c, settings.armWidthKpc, arms[place.armIndex[c]].name)}`
          : d.reason,
      flags,
      xKpc: nullable(place.xKpc[c]),
      yKpc: nullable(place.yKpc[c]),
      RKpc: nullable(place.RKpc[c]),
      betaDeg: nullable(place.betaDeg[c]),
      arm: placed ? arms[place.armIndex[c]].name : null,
      perpOffsetKpc: nullable(place.perpOffsetKpc[c]),
      azimuthOffsetDeg: nullable(place.azimuthOffsetDeg[c]),
      gasToStarsAcrossKpc: nullable(gts.acrossKpc[c]),
      used: used[c] === 1,
      excludedBecause: exclusion[c],
    };
  });
  const sources: OrderingResult['sources'] = [];
  for (let i = 0; i < cols.count; i++) {
    if (!(members.xKpc[i] === members.xKpc[i])) continue;
    sources.push({
      complexId: complexes[cols.complexIndex[i]].id,
      kind: TRACER_KINDS[cols.kind[i]],
      xKpc: members.xKpc[i],
      yKpc: members.yKpc[i],
      perpOffsetKpc: nullable(memberOffsets.perpOffsetKpc[i]),
    });
  }
  const warnings = warningsFor({
    complexes: n,
    used: usedCount,
    reasons,
    velocityFallback: inputs.velocitySource.filter((s) => s === VELOCITY_SOURCE.allFallback).length,
    independentInsteadOfKinematic: decisions.filter((d) => d.choice === 'independent').length,
    straddlingCorotation: straddling,
    nearCorotationDelays: delay.nearCorotationCount,
    orbitAlongSight: countUsed(gts.orbitAlongSight, used),
    gasToStars: gasToStars.n,
    corotationKpc,
    allInside: angularSpeedKmsKpc(R0, curve) > omegaP,
  });
  progress(1);
  return {
    classes,
    gasToStars,
    delayMyr: delay.summary,
    ks,
    perArm,
    radialBins: bins,
    corotationKpc,
    exclusions: { complexes: n, used: usedCount, reasons },
    warnings,
    complexes: rows,
    sources,
    conventions: conventionsText({
      corotationKpc,
      patternSpeedKmsKpc: omegaP,
      resamples,
      seed,
      R0Kpc: R0,
    }),
  };
}

function countUsed(flag: Uint8Array, used: Uint8Array): number {
  let k = 0;
  for (let c = 0; c < flag.length; c++) k += flag[c] & used[c];
  return k;
}

function offArmWords(p: ComplexPlacement, c: number, widthKpc: number, arm: string): string {
  if (!p.withinRange[c]) return `nearest arm ${arm} ends before this complex`;
  return `${Math.abs(p.perpOffsetKpc[c]).toFixed(2)} kpc from the ridge of ${arm}, beyond the arm width ${widthKpc} kpc`;
}
