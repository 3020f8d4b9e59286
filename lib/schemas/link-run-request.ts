/**
 * The body of `POST /api/projects/{id}/link-runs` and `…/link-runs/estimate`, shared by the route
 * handlers and the link-run form, so that the limits the form states are the ones the API applies.
 */
import { z } from 'zod';
import { plainText } from './text';

/** The numeric limits of the request, named so the form can state them beside each field. */
export const LINK_RUN_LIMITS = {
  catalogs: { min: 2, max: 8 },
  radiusArcsec: { min: 0, max: 36_000 },
  scaleFactor: { max: 100 },
  velocityKms: { min: 0, max: 1000 },
  chanceTrials: { min: 0, max: 10 },
  complexCap: { min: 2, max: 100_000 },
  name: { max: 200 },
} as const;

const L = LINK_RUN_LIMITS;

/** The link-run body of API.md, with the options a careful user needs made explicit. */
export const linkRunSchema = z.object({
  catalogIds: z
    .array(z.string())
    .min(L.catalogs.min, 'Choose at least two catalogs.')
    .max(L.catalogs.max, 'Choose at most eight catalogs.'),
  radius: z.discriminatedUnion('mode', [
    z.object({
      mode: z.literal('fixed'),
      arcsec: z.number().min(L.radiusArcsec.min).max(L.radiusArcsec.max),
    }),
    z.object({
      mode: z.literal('scaled'),
      factor: z.number().positive().max(L.scaleFactor.max),
      minArcsec: z.number().min(L.radiusArcsec.min).max(L.radiusArcsec.max),
    }),
  ]),
  velocity: z.discriminatedUnion('mode', [
    z.object({
      mode: z.literal('fixed'),
      kms: z.number().min(L.velocityKms.min).max(L.velocityKms.max),
    }),
    z.object({ mode: z.literal('scaled'), factor: z.number().positive().max(L.scaleFactor.max) }),
    z.object({ mode: z.literal('ignore') }),
  ]),
  linkMode: z.enum(['all', 'nearest', 'mutual']).default('all'),
  chanceTrials: z.number().int().min(L.chanceTrials.min).max(L.chanceTrials.max).default(0),
  missingVelocity: z.enum(['exclude', 'position-only']).default('exclude'),
  complexCap: z.number().int().min(L.complexCap.min).max(L.complexCap.max).default(500),
  name: plainText({ max: L.name.max }).optional(),
});

export type LinkRunParams = z.infer<typeof linkRunSchema>;

/** A quantity the chosen tolerances scale by, and how many rows of a chosen catalog lack it. */
export type ScalingWarning = {
  catalogId: string;
  catalogName: string;
  quantity: 'lineWidth' | 'size';
  missingRows: number;
  rowCount: number;
  message: string;
};
