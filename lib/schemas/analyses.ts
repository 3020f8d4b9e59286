/**
 * Request schemas of the ordering analyses, shared by the route handlers, the services and the
 * browser's forms (one module, so the two sides cannot drift apart). The result shape is
 * `OrderingResult` of `@/lib/ordering/types`.
 */
import { z } from 'zod';
import { ARM_MODEL_PRESETS } from '@/lib/astro/arms';
import type { DistanceChoice } from '@/lib/ordering/types';
import { plainText } from './text';

/** One arm the user defines: a log spiral over a range of Galactocentric azimuth. */
export const customArmSchema = z.object({
  name: plainText({ max: 60 }).min(1),
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
    z.object({
      // Own keys only: `__proto__` or `constructor` would otherwise find Object.prototype's.
      preset: z.string().refine((k) => Object.hasOwn(ARM_MODEL_PRESETS, k), {
        message: `No such arm model; use one of ${Object.keys(ARM_MODEL_PRESETS).join(', ')}.`,
      }),
      /** Scale the preset's radii from the R0 it was fitted with to the curve's R0. */
      rescaleToCurveR0: z.boolean().optional(),
    }),
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
  /** Tangent-point method: only sources within this many km/s of the terminal velocity. */
  tangentNearTerminalKms: z.number().positive().max(200).nullable().optional(),
});

/** A parsed analysis request. */
export type AnalysisParams = z.infer<typeof analysisSchema>;

const tracerKind = z.enum(['hi', 'co', 'hii', 'ob', 'other']);

/** A galaxy seen from outside: where it is, how its disc lies, how it rotates (API.md). */
export const externalGalaxySchema = z.object({
  centerRaDeg: z.number().min(0).lt(360),
  centerDecDeg: z.number().min(-90).max(90),
  distanceMpc: z.number().positive().max(1000),
  inclinationDeg: z.number().min(0).max(85, 'Inclinations above 85° cannot be deprojected.'),
  /** Position angle of the receding major axis, east of north. */
  positionAngleDeg: z.number().min(0).lt(360),
  rotation: z.enum(['counterclockwise', 'clockwise', 'trailing-arms']),
  rotationCurve: z.union([
    z.object({ kind: z.literal('flat'), vKms: z.number().positive().max(1000) }),
    z.object({
      kind: z.literal('table'),
      points: z
        .array(z.tuple([z.number().positive(), z.number().positive()]))
        .min(2, 'Give at least two (R, V) rows.')
        .max(500),
    }),
  ]),
  systemicVelocityKms: z.number().min(-1000).max(30_000).optional(),
});

/** A project's target: the Milky Way, or one external galaxy (kept in the project's settings). */
export const projectTargetSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('milky-way') }),
  z.object({
    kind: z.literal('external-galaxy'),
    name: plainText({ max: 100 }).optional(),
    galaxy: externalGalaxySchema,
  }),
]);

/** The external-galaxy analysis body of the API (`galaxy` may come from the project's target). */
export const externalAnalysisSchema = z
  .object({
    kind: z.literal('external-galaxy'),
    catalogIds: z.array(z.string().min(1)).min(1).max(20).optional(),
    runId: z.string().min(1).optional(),
    galaxy: externalGalaxySchema.optional(),
    arms: z.number().int().min(1).max(8).default(2),
    rings: z
      .object({
        minKpc: z.number().min(0).max(100),
        maxKpc: z.number().positive().max(100),
        widthKpc: z.number().positive().max(20),
      })
      .refine((r) => r.maxKpc > r.minKpc, 'rings.maxKpc must exceed rings.minKpc.'),
    gasKinds: z.array(tracerKind).min(1).optional(),
    youngKinds: z.array(tracerKind).min(1).optional(),
    resamples: z
      .number()
      .int()
      .min(2000, 'Use at least 2 000 resamples.')
      .max(20_000)
      .default(2000),
    seed: z.number().int().default(1),
  })
  .refine((b) => (b.catalogIds === undefined) !== (b.runId === undefined), {
    message: 'Give either catalogIds or runId.',
  });

/** Either analysis body: `kind` picks the Milky-Way or the external-galaxy analysis. */
export const anyAnalysisSchema = z.union([analysisSchema, externalAnalysisSchema]);

export type ExternalAnalysisParams = z.infer<typeof externalAnalysisSchema>;
export type ProjectTarget = z.infer<typeof projectTargetSchema>;

/**
 * A complex as the run's latest done ordering analysis placed it, as the complexes API returns
 * it: distance (kpc) as the median of its Monte Carlo draws with the 68 % (`distLoKpc`–
 * `distHiKpc`) and 95 % intervals, the probability of the near root, its arm and signed offset
 * from the ridge (kpc, positive ahead in the sense of rotation).
 */
export type ComplexAnalysisJson = {
  id: string;
  finishedAt: string;
  distKpc: number | null;
  distLoKpc: number | null;
  distHiKpc: number | null;
  distCi95: [number, number] | null;
  pNear: number | null;
  choice: DistanceChoice;
  arm: string | null;
  perpOffsetKpc: number | null;
  used: boolean;
};

/** `PATCH /api/analyses/{id}`: rename, describe, archive or restore; at least one field. */
export const analysisPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the analysis a name.').max(200).nullable().optional(),
    note: z.string().max(4000).nullable().optional(),
    archived: z.boolean().optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, 'Give name, note or archived.');
export type AnalysisPatch = z.infer<typeof analysisPatchSchema>;

/** What an analysis carries for its lifecycle: `name` falls back to what it was run on. */
export type AnalysisLifecycleJson = {
  name: string;
  customName: string | null;
  note: string | null;
  archivedAt: string | null;
};
