/**
 * The ordering analysis of a spiral galaxy seen from outside: sources are deprojected into the
 * disc (`./deproject`), the azimuthal offset Δφ between gas and young stars is measured ring by
 * ring (`./ring-offsets`), and Δφ(R) = K (Ω(R) − Ω_p) t is fitted for the pattern speed and the
 * timescale (`@/lib/ordering/pattern-fit`; Egusa et al. 2004, PASJ 56, L45; Egusa et al. 2009,
 * ApJ 697, 1870; Tamburro et al. 2008, AJ 136, 2872). A permutation test (`./null-test`) says
 * whether any offset is there at all, which many galaxies lack (Foyle et al. 2011, ApJ 735, 101).
 * Offsets are as measured: young minus gas, positive ahead in the sense of rotation.
 */
import { fitPatternSpeed, type PatternFit } from '@/lib/ordering/pattern-fit';
import type { TracerKind } from '@/lib/ordering/types';
import { deriveSeed } from '@/lib/stats/rng';
import { fitLogSpiralArms, type ArmsFit } from './arms-fit';
import { deprojectToDisc } from './deproject';
import { ringNullTest, type RingNullTest } from './null-test';
import {
  GAS,
  NEITHER,
  YOUNG,
  ringEdgesKpc,
  ringIndex,
  ringOffsets,
  type RingOffset,
} from './ring-offsets';
import { makeExternalRotationCurve } from './rotation';
import {
  DEFAULT_GAS_KINDS,
  DEFAULT_YOUNG_KINDS,
  sourceColumns,
  validateGalaxy,
  validateOptions,
  type Ci95,
  type ExternalAnalysisOptions,
  type ExternalGalaxy,
  type ExternalSource,
  type ExternalSourceColumns,
  type LogSpiralArms,
  type RingSpec,
  type SkyRotationSense,
} from './types';

const DEG = Math.PI / 180;

/** Label permutations of the null test unless the options say otherwise (common practice). */
export const DEFAULT_PERMUTATIONS = 999;

/** One ring of the result (degrees). dphiDeg is null, with a reason, when the ring is not measured. */
export type ExternalRingResult = {
  RKpc: number;
  minKpc: number;
  maxKpc: number;
  nGas: number;
  nYoung: number;
  /** Mean Ω(R) of the ring's gas and young sources, the abscissa of the fit. */
  omegaKmsKpc: number;
  dphiDeg: number | null;
  ci95: Ci95 | null;
  atLagLimit: boolean;
  reason: string | null;
  ridge: { gasDeg: number; youngDeg: number; youngMinusGasDeg: number; ci95: Ci95 } | null;
};

/** The analysis result; names of the contract (rings, fit, nullTest) kept, the rest added. */
export type ExternalAnalysisResult = {
  rotation: SkyRotationSense;
  /** How the sense of rotation was inferred from trailing arms, when it was. */
  rotationInference: { pitchDegIfClockwise: number; pitchCi95: Ci95; clear: boolean } | null;
  rings: ExternalRingResult[];
  /** The fit when a slope could be fitted (Ω_p may still be null; see its reason), else null. */
  fit: PatternFit | null;
  fitReason: string | null;
  nullTest: (RingNullTest & { observedDeg: number }) | null;
  /** Arms fitted to options.armsFrom (null when entered by hand or too few sources). */
  armsFit: ArmsFit | null;
  /** Arms used for the ridge cross-check (entered or fitted). */
  armModel: LogSpiralArms | null;
  sources: { RKpc: Float64Array; phiDeg: Float64Array; classCode: Int8Array };
};

/**
 * Runs the analysis on sources (objects or columns; RA/Dec in deg) of a galaxy. Throws
 * RangeError naming the first bad field of the galaxy, the options or a source.
 */
export function runExternalAnalysis(
  sources: ExternalSource[] | ExternalSourceColumns,
  galaxy: ExternalGalaxy,
  options: ExternalAnalysisOptions,
): ExternalAnalysisResult {
  validateGalaxy(galaxy);
  validateOptions(options);
  const cols = sourceColumns(sources);
  const m = options.arms;
  const curve = makeExternalRotationCurve(galaxy.rotationCurve);
  const classCode = classCodes(
    cols.kind,
    options.gasKinds ?? DEFAULT_GAS_KINDS,
    options.youngKinds ?? DEFAULT_YOUNG_KINDS,
  );
  const armsClass = options.armsFrom === 'young' ? YOUNG : GAS;
  const { rings } = options;
  const fitArms = (RKpc: Float64Array, phiRad: Float64Array) => {
    const keep: number[] = [];
    for (let i = 0; i < RKpc.length; i++)
      if (classCode[i] === armsClass && RKpc[i] >= rings.minKpc && RKpc[i] < rings.maxKpc)
        keep.push(i);
    return fitLogSpiralArms(
      Float64Array.from(keep, (i) => RKpc[i]),
      Float64Array.from(keep, (i) => phiRad[i]),
      m,
      { resamples: options.resamples, seed: deriveSeed(options.seed, 1) },
    );
  };

  let rotation: SkyRotationSense;
  let rotationInference: ExternalAnalysisResult['rotationInference'] = null;
  let disc = deprojectToDisc(cols.raDeg, cols.decDeg, { ...galaxy, rotation: 'clockwise' });
  let armsFit: ArmsFit | null = null;
  if (galaxy.rotation === 'trailing-arms') {
    const asClockwise = fitArms(disc.RKpc, disc.phiRad);
    if (!asClockwise)
      throw new RangeError(
        `galaxy.rotation = 'trailing-arms' needs at least 3 ${options.armsFrom ?? 'gas'} sources in the rings`,
      );
    // Trailing arms have ψ > 0 in the rotation-sense azimuth (see ./arms-fit).
    rotation = asClockwise.pitchDeg > 0 ? 'clockwise' : 'counterclockwise';
    rotationInference = {
      pitchDegIfClockwise: asClockwise.pitchDeg,
      pitchCi95: asClockwise.pitchCi95,
      clear: asClockwise.pitchCi95[0] * asClockwise.pitchCi95[1] > 0,
    };
    if (rotation === 'clockwise') armsFit = asClockwise;
  } else {
    rotation = galaxy.rotation;
  }
  if (rotation === 'counterclockwise')
    disc = deprojectToDisc(cols.raDeg, cols.decDeg, { ...galaxy, rotation });
  if (!options.armModel && !armsFit) armsFit = fitArms(disc.RKpc, disc.phiRad);
  const armModel: LogSpiralArms | null = options.armModel ?? armsFit;

  const common = {
    m,
    seed: options.seed,
    kernelRad: (options.kernelDeg ?? 5) * DEG,
    bins: options.azimuthBins ?? 256,
    minPerClass: options.minPerClass ?? 10,
  };
  const measured = ringOffsets(disc.RKpc, disc.phiRad, classCode, rings, {
    ...common,
    seed: deriveSeed(options.seed, 0),
    resamples: options.resamples,
    arms: armModel,
  });
  const omegas = ringOmegas(disc.RKpc, classCode, rings, (R) => curve.omegaKmsKpc(R));
  const fit = fitPatternSpeed(
    measured.map((ring, k) => ({
      RKpc: ring.RKpc,
      omegaKmsKpc: omegas[k],
      dphiRad: ring.dphiRad ?? 0,
      n: ring.dphiRad === null ? 0 : ring.nGas + ring.nYoung,
      replicatesRad: ring.replicatesRad,
    })),
    curve,
  );
  const nullTest = ringNullTest(disc.RKpc, disc.phiRad, classCode, rings, {
    ...common,
    seed: deriveSeed(options.seed, 2),
    permutations: options.permutations ?? DEFAULT_PERMUTATIONS,
  });

  return {
    rotation,
    rotationInference,
    rings: measured.map((ring, k) => ringResult(ring, omegas[k])),
    fit: fit.timescaleMyr === null ? null : fit,
    fitReason: fit.reason,
    nullTest: nullTest && { ...nullTest, observedDeg: nullTest.observedRad / DEG },
    armsFit,
    armModel,
    sources: {
      RKpc: disc.RKpc,
      phiDeg: disc.phiRad.map((p) => p / DEG),
      classCode,
    },
  };
}

function classCodes(
  kinds: ArrayLike<TracerKind>,
  gas: TracerKind[],
  young: TracerKind[],
): Int8Array {
  const gasSet = new Set(gas);
  const youngSet = new Set(young);
  return Int8Array.from({ length: kinds.length }, (_, i) =>
    gasSet.has(kinds[i]) ? GAS : youngSet.has(kinds[i]) ? YOUNG : NEITHER,
  );
}

/** Mean Ω(R) over each ring's gas and young sources (Ω at the ring's middle when it has none). */
function ringOmegas(
  RKpc: Float64Array,
  classCode: Int8Array,
  rings: RingSpec,
  omegaAt: (RKpc: number) => number,
): Float64Array {
  const edges = ringEdgesKpc(rings);
  const ring = ringIndex(RKpc, edges);
  const count = edges.length - 1;
  const sum = new Float64Array(count);
  const n = new Float64Array(count);
  for (let i = 0; i < RKpc.length; i++) {
    if (classCode[i] === NEITHER || ring[i] < 0) continue;
    sum[ring[i]] += omegaAt(RKpc[i]);
    n[ring[i]]++;
  }
  return sum.map((s, k) => (n[k] > 0 ? s / n[k] : omegaAt(0.5 * (edges[k] + edges[k + 1]))));
}

function ringResult(ring: RingOffset, omegaKmsKpc: number): ExternalRingResult {
  const deg = (ci: Ci95): Ci95 => [ci[0] / DEG, ci[1] / DEG];
  return {
    RKpc: ring.RKpc,
    minKpc: ring.minKpc,
    maxKpc: ring.maxKpc,
    nGas: ring.nGas,
    nYoung: ring.nYoung,
    omegaKmsKpc,
    dphiDeg: ring.dphiRad === null ? null : ring.dphiRad / DEG,
    ci95: ring.ci95Rad && deg(ring.ci95Rad),
    atLagLimit: ring.atLagLimit,
    reason: ring.reason,
    ridge: ring.ridge && {
      gasDeg: ring.ridge.gasRad / DEG,
      youngDeg: ring.ridge.youngRad / DEG,
      youngMinusGasDeg: ring.ridge.youngMinusGasRad / DEG,
      ci95: deg(ring.ridge.ci95Rad),
    },
  };
}
