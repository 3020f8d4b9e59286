/** Request schemas of the catalog API shared by the route handlers and the pages. */
import { z } from 'zod';

/** Which records a list returns: archived ones are left out unless asked for. */
export const archivedFilterSchema = z.enum(['exclude', 'include', 'only']).default('exclude');
export type ArchivedFilter = z.infer<typeof archivedFilterSchema>;

/** The `archived` query parameter of a project's catalog, run and analysis lists. */
export const archivedFilterFromUrl = (url: string): ArchivedFilter =>
  archivedFilterSchema.parse(new URL(url).searchParams.get('archived') ?? undefined);

/** `PATCH /api/catalogs/{id}`: archive (or restore) a catalog; its rows are kept either way. */
export const catalogPatchSchema = z.object({ archived: z.boolean() }).strict();

/** A run or analysis that reads a catalog or a run: what a refused delete lists. */
export const dependentSchema = z.object({ id: z.string(), name: z.string() });
export type Dependent = z.infer<typeof dependentSchema>;

/** The `details` of a 409 answer to deleting a catalog that runs or analyses use. */
export const catalogDependentsSchema = z.object({
  runs: z.array(dependentSchema),
  analyses: z.array(dependentSchema),
});
export type CatalogDependents = z.infer<typeof catalogDependentsSchema>;

// ---- Upload, preview and parse report ----

/** A multipart checkbox: `true`/`1`/`on` or `false`/`0`/`off`/empty. */
const formBoolean = z
  .enum(['true', 'false', '1', '0', 'on', 'off', ''])
  .transform((v) => v === 'true' || v === '1' || v === 'on');

/** Text fields of `POST /api/projects/{id}/catalogs/preview` (besides the file). */
export const previewFieldsSchema = z.object({
  /** Read `30,1` as 30.1 in the preview's checks; by default, as detected. */
  decimalComma: formBoolean.optional(),
});

/** Text fields of `POST /api/projects/{id}/catalogs` (besides the file). */
export const uploadFieldsSchema = z.object({
  name: z.string().trim().min(1, 'Give the catalog a name.').max(200),
  kind: z.enum(['hi', 'co', 'hii', 'ob', 'other']),
  policy: z.enum(['skip-bad-rows', 'reject-file']).default('skip-bad-rows'),
  mapping: z.string().optional(),
  /** Read numbers written with a decimal comma (`30,1`) as 30.1; stored with the catalog. */
  decimalComma: formBoolean.default(false),
});

/** What the preview says about decimal commas: the columns that look like `30,1`, and the choice applied. */
export interface DecimalCommaJson {
  columns: string[];
  applied: boolean;
}
