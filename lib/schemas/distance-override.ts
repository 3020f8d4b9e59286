/**
 * The body of `PUT /api/link-runs/{runId}/complexes/{complexId}/distance`, shared by the route and
 * the distance panel so that the limit the panel states is the one the API applies.
 */
import { z } from 'zod';
import { plainText } from './text';

/** An editor's distance is above 0 and at most this far (kpc): beyond the Galaxy's disc. */
export const MAX_OVERRIDE_DIST_KPC = 50;
export const MAX_OVERRIDE_NOTE_CHARS = 2000;

export const distanceOverrideSchema = z.object({
  distKpc: z.number().positive().max(MAX_OVERRIDE_DIST_KPC).nullable(),
  note: plainText({ max: MAX_OVERRIDE_NOTE_CHARS, multiline: true }).default(''),
});

export type DistanceOverride = z.infer<typeof distanceOverrideSchema>;
