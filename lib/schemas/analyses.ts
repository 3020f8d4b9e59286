/**
 * Request schemas of the ordering analyses, shared by the route handlers, the services and the
 * browser's forms (one module, so the two sides cannot drift apart). The result shape is
 * `OrderingResult` of `@/lib/ordering/types`.
 */
import { z } from 'zod';

/** One arm the user defines: a log spiral over a range of Galactocentric azimuth. */
export const customArmSchema = z.object({
  name: z.string().trim().min(1).max(60),
  Rref: z.number().positive().max(50),
  betaRefDeg: z.number().min(-720).max(720),
  pitchDeg: z.number().gt(-60).lt(60),
  betaMinDeg: z.number().min(-720).max(720),
  betaMaxDeg: z.number().min(-720).max(720),
});

/** The near/far rules of the distance draws (docs/methods.md, "Distances as distributions"). */
export const NEAR_FAR_RULES = ['probabilistic', 'near', 'far', 'latitude', 'independent'] as const;

/** The Milky-Way analysis body of the API, with the settings a project can edit. */
export const analysisSchema = z.object({
  kind: z.literal('milky-way').default('milky-way'),
  runId: z.string().min(1),
  curve: z.object({
    name: z.enum(['flat', 'brand-blitz-1993', 'reid-2014', 'reid-2019']),
    R0: z.number().positive().max(20).optional(),
    theta0: z.number().positive().max(400).optional(),
    /** 1σ of R0 (kpc) and Θ0 (km/s) for the Monte Carlo; the preset's published values by default. */
    R0Err: z.number().min(0).max(2).optional(),
    theta0Err: z.number().min(0).max(50).optional(),
  }),
  arms: z.union([
    z.object({ preset: z.string().min(1) }),
    z.object({ custom: z.array(customArmSchema).min(1, 'Give at least one arm.').max(12) }),
  ]),
  /** A pattern speed the user assumes (km/s/kpc); optional, used only where labelled so. */
  patternSpeed: z.number().positive().max(200).nullable().optional(),
  nearFar: z.enum(NEAR_FAR_RULES).default('probabilistic'),
  resamples: z
    .number()
    .int()
    .min(2000, 'Use at least 2 000 resamples (docs/methods.md, "Intervals").')
    .max(20_000)
    .default(2000),
  seed: z.number().int().default(1),
  armWidthKpc: z.number().positive().max(5).default(1),
  sigmaStreamKms: z.number().min(0).max(50).default(7),
  scaleHeightKpc: z.number().positive().max(2).default(0.06),
  velocityFrom: z.enum(['gas', 'all']).default('gas'),
  mcDraws: z.number().int().min(50).max(5000).default(200),
});

/** A parsed analysis request. */
export type AnalysisParams = z.infer<typeof analysisSchema>;
