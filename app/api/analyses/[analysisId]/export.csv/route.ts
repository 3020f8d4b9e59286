import { z } from 'zod';
import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { analysisProject } from '@/lib/services/analyses';
import { analysisCsv } from '@/lib/services/analysis-exports';

const querySchema = z.object({
  table: z.enum(['complexes', 'classes', 'sources']).default('complexes'),
});

export const GET = route<{ analysisId: string }>(async (req, { analysisId }) => {
  await requireProjectRole(await analysisProject(analysisId), 'viewer', req);
  const { table } = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return new Response(await analysisCsv(analysisId, table), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="ordering-${analysisId.slice(0, 8)}-${table}.csv"`,
    },
  });
});
