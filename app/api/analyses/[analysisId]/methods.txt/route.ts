import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { analysisProject } from '@/lib/services/analyses';
import { analysisMethods } from '@/lib/services/analysis-exports';

export const GET = route<{ analysisId: string }>(async (req, { analysisId }) => {
  await requireProjectRole(await analysisProject(analysisId), 'viewer', req);
  return new Response(await analysisMethods(analysisId), {
    headers: {
      'content-type': 'text/plain; charset=utf-8',
      'content-disposition': `attachment; filename="ordering-${analysisId.slice(0, 8)}-methods.txt"`,
    },
  });
});
