/**
 * Parameters of the demo galaxy: the density wave (arms, pattern speed, rotation curve), the
 * life cycle of a star-forming complex, and per tracer class the placement, velocity and size
 * models. Every number here is invented for the demo ("Harbor Ridge Radio Group" scenario) but
 * kept to magnitudes the trade considers typical; the truth file records all of them.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import type { RotationCurveName } from '@/lib/astro/rotation-curves';

/** Tracer classes the generator produces, in catalog order. */
export const TRACERS = ['HI', 'CO', 'HII', 'OB'] as const;
/** One of the generated tracer classes. */
export type Tracer = (typeof TRACERS)[number];

/** Placement, velocity and size model of one tracer class. */
export type TracerParams = {
  /** Shift of members from their complex centre along the flow through the arm, pc; negative = upstream. */
  intraShiftPc: number;
  /** 1σ isotropic scatter (pc) of members about their shifted position. */
  memberScatterPc: number;
  /** 1σ line-of-sight velocity (km/s) of members about their complex's systemic velocity. */
  memberVelSigmaKms: number;
  /** 1σ velocity measurement error (km/s), also written where the file has an error column. */
  velErrKms: number;
  /** Median physical diameter (pc) and natural-log spread of the log-normal size distribution. */
  sizeMedianPc: number;
  sizeSigmaLn: number;
  /** Share of the interlopers (sources in no complex) that belong to this class; shares sum to 1. */
  interloperShare: number;
  /** Half-thickness (half width at half maximum, pc) of this class's interloper layer. */
  interloperHwhmPc: number;
};

/** Life cycle of a complex in the frame of the spiral pattern (times in Myr). */
export type PhaseParams = {
  /**
   * Phase (Myr relative to the moment the gas crosses the ridge line) at which gas enters the
   * arm and a complex is born; negative = before the ridge. The azimuthal offset of a point of
   * phase τ is Δβ = (Ω(R) − Ω_p)·τ, so inside corotation negative phases lie behind the ridge
   * and outside corotation ahead of it.
   */
  birthPhaseMyr: number;
  /** 1σ scatter (Myr) of the birth phase between complexes. */
  birthJitterMyr: number;
  /** Complex ages are uniform on [0, maxAgeMyr]. */
  maxAgeMyr: number;
  /** Star-formation delay: young-star members exist only once a complex is this old (Myr). */
  starFormationDelayMyr: number;
  /** HII regions shine from the delay until delay + this (Myr). */
  hiiLifetimeMyr: number;
  /** Probability that a complex past the delay shows an OB association. */
  obProbability: number;
  /** Mean extra CO and HI members of a newborn complex; falls linearly to gasFloor of it at maxAgeMyr. */
  coMeanExtra: number;
  hiMean: number;
  gasFloor: number;
  /** Mean extra HII regions (beyond the first) of a complex in its HII phase. */
  hiiMeanExtra: number;
};

/** Independent distances of OB associations (parallax-like or photometric). */
export type DistanceParams = {
  /** Share of OB associations that carry an independent distance. */
  fraction: number;
  /** 1σ parallax error (mas) of an association's mean parallax. */
  parallaxErrMas: number;
  /** A parallax distance is given when the true parallax exceeds this many σ; else photometric. */
  parallaxMinSnr: number;
  /** 1σ distance-modulus error (mag) of a photometric distance. */
  photometricErrMag: number;
};

/** Every model parameter of the demo galaxy. */
export type ModelParams = {
  /** Rotation-curve preset name for `makeRotationCurve`; R0 and Θ0 come from the preset. */
  rotationCurve: RotationCurveName;
  /** Spiral pattern speed Ω_p, km/s/kpc. */
  patternSpeedKmsKpc: number;
  /** The two ridge lines (log spirals). */
  arms: ArmSpec[];
  phase: PhaseParams;
  /** Half-thickness (HWHM, pc) of the layer of complex centres. */
  complexHwhmPc: number;
  /** 1σ line-of-sight velocity (km/s) of complexes about circular rotation plus streaming. */
  complexVelSigmaKms: number;
  /** Peak streaming speed (km/s) on a ridge line, falling off as a Gaussian across the arm. */
  streamingKms: number;
  /** 1σ half-width (kpc, perpendicular to the ridge) of the streaming profile. */
  streamingWidthKpc: number;
  /** 1σ line-of-sight velocity (km/s) of interlopers about circular rotation plus streaming. */
  interloperVelSigmaKms: number;
  /** Interlopers follow an exponential disc with this scale length (kpc) between the radii below. */
  interloperScaleLengthKpc: number;
  interloperMinRKpc: number;
  interloperMaxRKpc: number;
  /** Sources closer than this to the Sun (kpc) are redrawn (they would fill the sky). */
  minDistKpc: number;
  distances: DistanceParams;
  tracers: Record<Tracer, TracerParams>;
};

/**
 * The demo's two-armed density wave: trailing log spirals (pitch 12.5°) 180° apart, from
 * R ≈ 4 kpc to R ≈ 15 kpc. The names are the demo scenario's own.
 */
export const DEFAULT_ARMS: ArmSpec[] = [
  {
    name: 'Cinderveil Arm',
    RrefKpc: 7.0,
    betaRefDeg: 10,
    pitchDeg: 12.5,
    betaMinDeg: -187,
    betaMaxDeg: 154,
  },
  {
    name: 'Tidelace Arm',
    RrefKpc: 7.0,
    betaRefDeg: 190,
    pitchDeg: 12.5,
    betaMinDeg: -7,
    betaMaxDeg: 334,
  },
];

/** Default model: see each field's doc; magnitudes are typical values of the trade (from memory). */
export const DEFAULT_MODEL: ModelParams = {
  rotationCurve: 'reid-2014',
  patternSpeedKmsKpc: 22,
  arms: DEFAULT_ARMS,
  phase: {
    birthPhaseMyr: -8,
    birthJitterMyr: 1,
    maxAgeMyr: 14,
    starFormationDelayMyr: 7,
    hiiLifetimeMyr: 5,
    obProbability: 0.8,
    coMeanExtra: 2,
    hiMean: 1.2,
    gasFloor: 0.2,
    hiiMeanExtra: 0.5,
  },
  complexHwhmPc: 50,
  complexVelSigmaKms: 4,
  streamingKms: 6,
  streamingWidthKpc: 0.3,
  interloperVelSigmaKms: 6,
  interloperScaleLengthKpc: 3.5,
  interloperMinRKpc: 3,
  interloperMaxRKpc: 16,
  minDistKpc: 0.3,
  distances: { fraction: 0.6, parallaxErrMas: 0.02, parallaxMinSnr: 10, photometricErrMag: 0.3 },
  tracers: {
    HI: {
      intraShiftPc: -5,
      memberScatterPc: 4,
      memberVelSigmaKms: 1.5,
      velErrKms: 0.5,
      sizeMedianPc: 40,
      sizeSigmaLn: 0.5,
      interloperShare: 0.35,
      interloperHwhmPc: 120,
    },
    CO: {
      intraShiftPc: -2.5,
      memberScatterPc: 3,
      memberVelSigmaKms: 1,
      velErrKms: 0.3,
      sizeMedianPc: 20,
      sizeSigmaLn: 0.5,
      interloperShare: 0.3,
      interloperHwhmPc: 50,
    },
    HII: {
      intraShiftPc: 2.5,
      memberScatterPc: 2,
      memberVelSigmaKms: 1.5,
      velErrKms: 1.5,
      sizeMedianPc: 6,
      sizeSigmaLn: 0.6,
      interloperShare: 0.15,
      interloperHwhmPc: 50,
    },
    OB: {
      intraShiftPc: 5,
      memberScatterPc: 4,
      memberVelSigmaKms: 2,
      velErrKms: 2.5,
      sizeMedianPc: 40,
      sizeSigmaLn: 0.4,
      interloperShare: 0.2,
      interloperHwhmPc: 80,
    },
  },
};

/** Gaussian σ of a layer with the given half width at half maximum: σ = HWHM / √(2 ln 2). */
export function sigmaFromHwhm(hwhm: number): number {
  return hwhm / Math.sqrt(2 * Math.LN2);
}
