import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { analysisProject, getAnalysis } from '@/lib/services/analyses';

export const GET = route<{ analysisId: string }>(async (req, { analysisId }) => {
  await requireProjectRole(await analysisProject(analysisId), 'viewer', req);
  return json({ analysis: await getAnalysis(analysisId) });
});
