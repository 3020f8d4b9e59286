/** Request schemas of the catalog API shared by the route handlers and the pages. */
import { z } from 'zod';

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
