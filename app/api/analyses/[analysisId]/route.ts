import { requireProjectRole, requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { analysisPatchSchema } from '@/lib/schemas/analyses';
import {
  analysisProject,
  deleteAnalysis,
  getAnalysis,
  updateAnalysis,
} from '@/lib/services/analyses';

type P = { analysisId: string };

export const GET = route<P>(async (req, { analysisId }) => {
  await requireProjectRole(await analysisProject(analysisId), 'viewer', req);
  return json({ analysis: await getAnalysis(analysisId) });
});

/** `{ name?, note?, archived? }` → the analysis as GET returns it. */
export const PATCH = route<P>(async (req, { analysisId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await analysisProject(analysisId),
    'editor',
    req,
    'change analyses',
  );
  const patch = analysisPatchSchema.parse(await jsonBody(req));
  return json({ analysis: await updateAnalysis(analysisId, user.id, patch) });
});

export const DELETE = route<P>(async (req, { analysisId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await analysisProject(analysisId),
    'editor',
    req,
    'delete analyses',
  );
  await deleteAnalysis(analysisId, user.id);
  return new Response(null, { status: 204 });
});
