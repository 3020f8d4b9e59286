import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { externalAnalysisSchema } from '@/lib/schemas/analyses';
import { analysisSchema, listAnalyses, startAnalysis } from '@/lib/services/analyses';
import { startExternalAnalysis } from '@/lib/services/external-analyses';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json({ analyses: await listAnalyses(projectId) });
});

const START = 'run ordering analyses';

/**
 * Starts an ordering analysis as a job → 202; poll GET /api/analyses/{id}. The body is either
 * member of `anyAnalysisSchema`: `kind` picks the member first, so that a mistake is named by
 * its field instead of by the union as a whole.
 */
export const POST = route<P>(async (req, { projectId }) => {
  const body = await jsonBody(req);
  if ((body as { kind?: unknown } | null)?.kind === 'external-galaxy') {
    const params = externalAnalysisSchema.parse(body);
    const { user } = await requireProjectRole(projectId, 'editor', req, START);
    return json({ analysis: await startExternalAnalysis(projectId, user.id, params) }, 202);
  }
  const params = analysisSchema.parse(body);
  const { user } = await requireProjectRole(projectId, 'editor', req, START);
  return json({ analysis: await startAnalysis(projectId, user.id, params) }, 202);
});
