/**
 * Parameters of the demo galaxy: the density wave (arms, pattern speed, rotation curve), the
 * life cycle of a star-forming complex, and per tracer class the placement, velocity and size
 * models. Every number here is invented for the demo ("Harbor Ridge Radio Group" scenario) but
 * kept to magnitudes the trade considers typical; the truth file records all of them.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import type { GalaxyCurveParams } from './curve';

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
  /**
   * Complex ages are uniform on [0, maxAgeMyr]; a complex that shows no tracer at its age is
   * drawn again (it would be in no catalog).
   */
  maxAgeMyr: number;
  /** Star-formation delay: young-star members exist only once a complex is this old (Myr). */
  starFormationDelayMyr: number;
  /** HII regions shine from the delay until delay + this (Myr). */
  hiiLifetimeMyr: number;
  /** Probability that a complex past the delay shows an OB association. */
  obProbability: number;
  /**
   * Gas of a complex: its mean member counts fall linearly from full at birth to gasAtDelay of
   * full at the star-formation delay, then to none over gasDispersalMyr as the young stars
   * disperse the cloud (stellar feedback). While gas remains, a complex has at least one CO
   * member plus a Poisson number of extra CO (mean coMeanExtra × the gas fraction) and of HI
   * (mean hiMean × the gas fraction).
   */
  coMeanExtra: number;
  hiMean: number;
  gasAtDelay: number;
  gasDispersalMyr: number;
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
  /** The generator's own rotation curve (none of the analysis presets), R0 included. */
  curve: GalaxyCurveParams;
  /** Spiral pattern speed Ω_p, km/s/kpc. */
  patternSpeedKmsKpc: number;
  /** The two ridge lines (log spirals). */
  arms: ArmSpec[];
  phase: PhaseParams;
  /** Half-thickness (HWHM, pc) of the layer of complex centres. */
  complexHwhmPc: number;
  /** 1σ line-of-sight velocity (km/s) of complexes about circular rotation plus streaming. */
  complexVelSigmaKms: number;
  /** Peak in-plane streaming speed (km/s) on a ridge line, falling off as a Gaussian across the arm. */
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

/** Pitch angle (deg) of the demo's arms, near the Milky Way's ≈ 12–13° (Vallée 2015, MNRAS 450, 4277). */
const PITCH_DEG = 14;

/**
 * The demo's two-armed density wave: trailing log spirals of pitch 14°, 180° apart, through
 * R = 7 kpc at β = 10° and 190°, each from R ≈ 4 kpc (inner end) to R ≈ 15 kpc (outer end).
 * Seen from the Sun the ridges have tangents at l ≈ 51° (first quadrant) and l ≈ 283° and
 * ≈ 327° (fourth quadrant), where the tangent-point method has data. The names are the demo
 * scenario's own.
 */
export const DEFAULT_ARMS: ArmSpec[] = [
  {
    name: 'Cinderveil Arm',
    RrefKpc: 7.0,
    betaRefDeg: 10,
    pitchDeg: PITCH_DEG,
    betaMinDeg: -165,
    betaMaxDeg: 138,
  },
  {
    name: 'Tidelace Arm',
    RrefKpc: 7.0,
    betaRefDeg: 190,
    pitchDeg: PITCH_DEG,
    betaMinDeg: 15,
    betaMaxDeg: 318,
  },
];

/**
 * Default model: see each field's doc. The numbers are invented but of the sizes the field
 * reports: R0 = 8.2 kpc and Θ0 = 236 km/s (Reid et al. 2019 quote 8.15 kpc and 236 km/s), a
 * pattern speed of 18.5 km/s/kpc that puts corotation at ≈ 12.6 kpc (inside the outer ends of
 * the arms), young stars 10 Myr after a complex's birth (within the 4–13 Myr of Egusa et al.
 * 2009, ApJ 697, 1870) with the cloud dispersed 2 Myr later (Kruijssen et al. 2019, Nature 569,
 * 519), and streaming of 10 km/s on the arms. The median young-star minus gas phase
 * is then ≈ 7.4 Myr and the separation across the arms ≈ 100–300 pc inside corotation, as
 * measured in the Milky Way (Vallée 2014, AJ 148, 5; Hou & Han 2015, MNRAS 454, 626).
 */
export const DEFAULT_MODEL: ModelParams = {
  curve: {
    R0Kpc: 8.2,
    theta0Kms: 236,
    turnoverKpc: 0.8,
    outerSlopeKmsKpc: -1.7,
    stepKpc: 0.25,
    maxKpc: 30,
  },
  patternSpeedKmsKpc: 18.5,
  arms: DEFAULT_ARMS,
  phase: {
    birthPhaseMyr: -6,
    birthJitterMyr: 1,
    maxAgeMyr: 15,
    starFormationDelayMyr: 10,
    hiiLifetimeMyr: 4,
    obProbability: 0.8,
    coMeanExtra: 2,
    hiMean: 1.2,
    gasAtDelay: 0.4,
    gasDispersalMyr: 2,
    hiiMeanExtra: 0.5,
  },
  complexHwhmPc: 50,
  complexVelSigmaKms: 4,
  streamingKms: 10,
  streamingWidthKpc: 0.4,
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
