/**
 * Types of the ordering analysis: its input (complexes of linked tracers and the settings) and
 * its result, exactly as the analysis contract states them. Angles in degrees, distances in kpc,
 * velocities in km/s (LSR), times in Myr; positions in the Galactocentric frame of
 * `@/lib/astro/galactocentric`.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import type { RotationCurve } from '@/lib/astro/rotation-curves';

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

/** Settings of one analysis run. */
export type OrderingSettings = {
  curve: RotationCurve;
  arms: ArmSpec[];
  /** A complex is assigned to its nearest arm only within this |perpendicular offset| (kpc). */
  armWidthKpc: number;
  patternSpeedKmsKpc: number;
  /** Non-circular (streaming) velocity dispersion added in quadrature to the measurement error. */
  sigmaStreamKms: number;
  /** Scale height of the young disc used by the latitude rule for near/far. */
  scaleHeightKpc: number;
  /** Which members' velocities give the complex's kinematic distance. */
  velocityFrom: 'gas' | 'all';
  /** Bootstrap resamples and sign-flip permutations (≥ 2000). */
  resamples: number;
  seed: number;
  /** Monte Carlo velocity draws per complex for the distance interval. */
  mcDraws: number;
};

/** A 95 % interval [lo, hi]. */
export type Ci = [number, number];

/** How a complex's distance was chosen. */
export type DistanceChoice =
  'near' | 'far' | 'tangent' | 'single' | 'independent' | 'override' | 'unresolved';

/** Summary of one tracer class: offsets of its members from the ridge of their complex's arm. */
export type ClassSummary = {
  kind: TracerKind;
  n: number;
  medianOffsetKpc: number | null;
  ci95: Ci | null;
  meanOffsetKpc: number | null;
  meanCi95: Ci | null;
  medianAzimuthOffsetDeg: number | null;
};

/** One complex as placed by the analysis. */
export type ComplexRow = {
  id: string;
  lDeg: number;
  bDeg: number;
  vLsrKms: number | null;
  distKpc: number | null;
  distLoKpc: number | null;
  distHiKpc: number | null;
  choice: DistanceChoice;
  reason: string;
  flags: string[];
  xKpc: number | null;
  yKpc: number | null;
  RKpc: number | null;
  betaDeg: number | null;
  arm: string | null;
  perpOffsetKpc: number | null;
  azimuthOffsetDeg: number | null;
  gasToStarsAcrossKpc: number | null;
  used: boolean;
  excludedBecause: string | null;
};

/** The full result (stored as JSON). */
export type OrderingResult = {
  classes: ClassSummary[];
  gasToStars: {
    n: number;
    medianAcrossKpc: number | null;
    ci95: Ci | null;
    meanAcrossKpc: number | null;
    medianAlongKpc: number | null;
    pValue: number | null;
  };
  delayMyr: { n: number; median: number | null; ci95: Ci | null };
  ks: { d: number; pValue: number } | null;
  perArm: {
    arm: string;
    n: number;
    classes: { kind: TracerKind; n: number; medianOffsetKpc: number | null; ci95: Ci | null }[];
    gasToStarsMedianKpc: number | null;
  }[];
  radialBins: {
    RminKpc: number;
    RmaxKpc: number;
    n: number;
    medianAcrossKpc: number | null;
    ci95: Ci | null;
    insideCorotation: boolean;
  }[];
  corotationKpc: number | null;
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
