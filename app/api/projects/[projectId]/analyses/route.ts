import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { analysisSchema, listAnalyses, startAnalysis } from '@/lib/services/analyses';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json({ analyses: await listAnalyses(projectId) });
});

/** Starts an ordering analysis as a job → 202; poll GET /api/analyses/{id}. */
export const POST = route<P>(async (req, { projectId }) => {
  const params = analysisSchema.parse(await jsonBody(req));
  const { user } = await requireProjectRole(projectId, 'editor', req, 'run ordering analyses');
  return json({ analysis: await startAnalysis(projectId, user.id, params) }, 202);
});
