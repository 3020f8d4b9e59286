/**
 * Types of the ordering analysis: its input (complexes of linked tracers and the settings) and
 * its result, exactly as the analysis contract states them. Angles in degrees, distances in kpc,
 * velocities in km/s (LSR), times in Myr; positions in the Galactocentric frame of
 * `@/lib/astro/galactocentric`.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import type { LvOffsetRow } from './lv-offsets';
import type { ArmTangentResult } from './tangents';

/** Tracer class of a member: atomic gas, molecular gas, HII region, OB association, other. */
export type TracerKind = 'hi' | 'co' | 'hii' | 'ob' | 'other';

/** One linked source. NaN marks a missing velocity, velocity error, distance or distance error. */
export type OrderingMember = {
  kind: TracerKind;
  lDeg: number;
  bDeg: number;
  vLsrKms: number;
  vErrKms: number;
  /** Independent (parallax or photometric) line-of-sight distance, kpc. */
  distKpc: number;
  distErrKpc: number;
};

/** A complex of linked sources, with an optional distance set by hand. */
export type OrderingComplex = {
  id: string;
  members: OrderingMember[];
  distanceOverride?: { distKpc: number; note?: string } | null;
};

/** How near/far is decided for a complex's distance draws (see `./distance-draws`). */
export type NearFarRule = 'probabilistic' | 'near' | 'far' | 'latitude' | 'independent';

/** Settings of one analysis run. */
export type OrderingSettings = {
  curve: RotationCurve;
  arms: ArmSpec[];
  /** A distance draw counts for a complex's arm only within this |perpendicular offset| (kpc). */
  armWidthKpc: number;
  /** A pattern speed the user states (km/s/kpc), used only where labelled as assumed; null = none. */
  patternSpeedKmsKpc: number | null;
  /** Non-circular (streaming) velocity dispersion added in quadrature to the measurement error. */
  sigmaStreamKms: number;
  /** 1σ uncertainties of the curve's R0 (kpc) and Θ0 (km/s) drawn in the Monte Carlo. */
  R0ErrKpc: number;
  theta0ErrKms: number;
  /** Scale height of the young disc used by the near/far rules. */
  scaleHeightKpc: number;
  nearFar: NearFarRule;
  /** Which members' velocities give the complex's kinematic distance. */
  velocityFrom: 'gas' | 'all';
  /** Bootstrap resamples and sign-flip permutations (≥ 2000). */
  resamples: number;
  seed: number;
  /** Monte Carlo distance draws per complex. */
  mcDraws: number;
  /** R0 (kpc) the arm model was fitted with, to warn when the curve uses another; null = unknown. */
  armsR0Kpc: number | null;
  /** Tangent-point method: keep only sources within this many km/s of the terminal velocity; null = all. */
  tangentNearTerminalKms: number | null;
  /** The link run's radius (arcsec, smallest and largest), to state the intra-complex bound in pc. */
  linkRadiusArcsec: [number, number] | null;
};

/** A 95 % interval [lo, hi]. */
export type Ci = [number, number];

/** How a complex's distance was chosen: the root most of its draws took, or its source. */
export type DistanceChoice =
  'near' | 'far' | 'tangent' | 'single' | 'independent' | 'override' | 'unresolved';

/** Offsets of one tracer class from the ridges of its complexes' arms (positive ahead). */
export type ClassSummary = {
  kind: TracerKind;
  /** Members and complexes that enter. */
  n: number;
  nComplexes: number;
  medianOffsetKpc: number | null;
  ci95: Ci | null;
  medianAzimuthOffsetDeg: number | null;
  azimuthCi95: Ci | null;
};

/** Young-star classes (HII, OB) minus gas classes (HI, CO): difference of their median offsets. */
export type YoungMinusGas = {
  nGas: number;
  nYoung: number;
  medianOffsetKpc: number | null;
  ci95: Ci | null;
  azimuthDeg: number | null;
  azimuthCi95: Ci | null;
};

/** One radial bin of the azimuthal offset between young stars and gas (positive ahead). */
export type RadialBin = {
  RminKpc: number;
  RmaxKpc: number;
  RKpc: number;
  omegaKmsKpc: number;
  nGas: number;
  nYoung: number;
  dphiDeg: number | null;
  ci95: Ci | null;
  /** Whether the pattern fit used the bin. */
  fitted: boolean;
};

/** The fitted pattern speed and timescale (null values are not constrained; `reason` says why). */
export type PatternFitSummary = {
  patternSpeedKmsKpc: number | null;
  patternSpeedCi95: Ci | null;
  timescaleMyr: number | null;
  timescaleCi95: Ci | null;
  corotationKpc: number | null;
  corotationCi95: Ci | null;
  binsUsed: number;
  constrained: boolean;
  reason: string | null;
  notes: string[];
  line: { omegaKmsKpc: [number, number]; dphiRad: [number, number] } | null;
};

/** Upstream/downstream as an interpretation: from the fitted pattern speed, or a stated one. */
export type Interpretation = {
  patternSpeedKmsKpc: number | null;
  source: 'fitted' | 'assumed' | null;
  corotationKpc: number | null;
  /** Share of the used complexes inside corotation (Ω > Ω_p at their median R). */
  insideShare: number | null;
  /** Sign of young minus gas that the pattern speed predicts (+1 ahead, −1 behind), or null. */
  predictedSign: 1 | -1 | null;
};

/** Offset of young stars from the gas of their own complex: bounded by the link radius. */
export type IntraComplex = {
  n: number;
  medianAcrossKpc: number | null;
  ci95: Ci | null;
  medianAlongKpc: number | null;
  /** Two-sided sign-flip test of a zero median across offset. */
  pValue: number | null;
  /** The link radius in pc at the 5th and 95th percentile distance of these complexes. */
  linkRadiusPc: Ci | null;
};

/** One complex as placed by the analysis (distances: median and intervals of its draws). */
export type ComplexRow = {
  id: string;
  lDeg: number;
  bDeg: number;
  vLsrKms: number | null;
  distKpc: number | null;
  distLoKpc: number | null;
  distHiKpc: number | null;
  distCi95: Ci | null;
  pNear: number | null;
  choice: DistanceChoice;
  reason: string;
  flags: string[];
  xKpc: number | null;
  yKpc: number | null;
  RKpc: number | null;
  betaDeg: number | null;
  arm: string | null;
  onArmShare: number;
  perpOffsetKpc: number | null;
  perpCi95: Ci | null;
  azimuthOffsetDeg: number | null;
  intraAcrossKpc: number | null;
  used: boolean;
  excludedBecause: string | null;
};

/** The full result (stored as JSON). */
export type OrderingResult = {
  headline: string[];
  classes: ClassSummary[];
  youngMinusGas: YoungMinusGas;
  perArm: {
    arm: string;
    n: number;
    classes: ClassSummary[];
    youngMinusGas: YoungMinusGas;
  }[];
  radialBins: RadialBin[];
  patternFit: PatternFitSummary | null;
  patternFitReason: string | null;
  interpretation: Interpretation;
  tangents: ArmTangentResult[];
  lvOffsets: LvOffsetRow[];
  lvMasked: Record<string, number>;
  intraComplex: IntraComplex;
  ks: { d: number; pValue: number } | null;
  distances: {
    draws: number;
    nearFar: NearFarRule;
    sigmaStreamKms: number;
    R0Kpc: number;
    R0ErrKpc: number;
    theta0Kms: number;
    theta0ErrKms: number;
    medianCi68WidthKpc: number | null;
  };
  exclusions: { complexes: number; used: number; reasons: Record<string, number> };
  warnings: string[];
  complexes: ComplexRow[];
  sources: {
    complexId: string;
    kind: TracerKind;
    xKpc: number;
    yKpc: number;
    perpOffsetKpc: number | null;
  }[];
  conventions: string;
};
