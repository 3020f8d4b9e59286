import { z } from 'zod';

/**
 * The query of a link-run export: which table, and whether every uploaded column of each side
 * follows the canonical ones (`columns=original`). Shared by the route handlers and the
 * download links.
 */
export const runExportQuerySchema = z.object({
  shape: z.enum(['links', 'complexes', 'sources']).default('links'),
  columns: z.enum(['canonical', 'original']).default('canonical'),
});

export type RunExportQuery = z.infer<typeof runExportQuerySchema>;

/** The URL of a run's export in `format` for `query`. */
export function runExportUrl(
  runId: string,
  format: 'csv' | 'vot',
  query: Pick<RunExportQuery, 'shape'> & Partial<RunExportQuery>,
): string {
  const params = new URLSearchParams({ shape: query.shape });
  if (query.columns === 'original') params.set('columns', 'original');
  return `/api/link-runs/${runId}/export.${format}?${params}`;
}
