import { requireProjectRole } from '@/lib/auth/access';
import { archivedFilterFromUrl } from '@/lib/schemas/catalogs';
import { json, jsonBody, route } from '@/lib/http/handler';
import { externalAnalysisSchema } from '@/lib/schemas/analyses';
import { analysisSchema, listAnalyses, startAnalysis } from '@/lib/services/analyses';
import { startExternalAnalysis } from '@/lib/services/external-analyses';
import { HttpError } from '@/lib/http/errors';
import { runProject } from '@/lib/services/link-runs';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json({ analyses: await listAnalyses(projectId, archivedFilterFromUrl(req.url)) });
});

const START = 'run ordering analyses';

/**
 * Starts an ordering analysis as a job → 202; poll GET /api/analyses/{id}. The body is either
 * member of `anyAnalysisSchema`: `kind` picks the member first, so that a mistake is named by
 * its field instead of by the union as a whole.
 */
export const POST = route<P>(async (req, { projectId }) => {
  const { user } = await requireProjectRole(projectId, 'editor', req, START);
  const body = await jsonBody(req);
  if ((body as { kind?: unknown } | null)?.kind === 'external-galaxy') {
    const params = externalAnalysisSchema.parse(body);
    if (params.runId) await requireRunOfProject(params.runId, projectId);
    return json({ analysis: await startExternalAnalysis(projectId, user.id, params) }, 202);
  }
  const params = analysisSchema.parse(body);
  await requireRunOfProject(params.runId, projectId);
  return json({ analysis: await startAnalysis(projectId, user.id, params) }, 202);
});

/** Another project's run answers as a missing one, whatever its state, so nothing leaks. */
async function requireRunOfProject(runId: string, projectId: string) {
  const owner = await runProject(runId).catch((e: unknown) => {
    if (e instanceof HttpError && e.status === 404) return null;
    throw e;
  });
  if (owner !== projectId) {
    throw new HttpError(400, 'unknown_run', 'runId: no such link run in this project.');
  }
}
