/** Request schemas of the link-run lifecycle, shared by the route handlers and the pages. */
import { z } from 'zod';

/** `PATCH /api/link-runs/{id}`: rename, describe, archive or restore; at least one field. */
export const runPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the run a name.').max(200).optional(),
    note: z.string().max(4000).nullable().optional(),
    archived: z.boolean().optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, 'Give name, note or archived.');
export type RunPatch = z.infer<typeof runPatchSchema>;

/** `DELETE /api/link-runs/{id}?withAnalyses=1` also deletes the analyses that read the run. */
export const runDeleteQuerySchema = z.object({
  withAnalyses: z.enum(['0', '1']).default('0'),
});

/** What `GET /api/link-runs/{id}` adds to a run for its lifecycle. */
export type RunLifecycleJson = { note: string | null; archivedAt: string | null };
