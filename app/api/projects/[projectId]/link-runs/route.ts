import { requireProjectRole } from '@/lib/auth/access';
import { archivedFilterFromUrl } from '@/lib/schemas/catalogs';
import { json, jsonBody, route } from '@/lib/http/handler';
import { linkRunSchema, listRuns, startLinkRun } from '@/lib/services/link-runs';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json({ runs: await listRuns(projectId, archivedFilterFromUrl(req.url)) });
});

export const POST = route<P>(async (req, { projectId }) => {
  const { user } = await requireProjectRole(projectId, 'editor', req, 'start link runs');
  const params = linkRunSchema.parse(await jsonBody(req));
  return json({ run: await startLinkRun(projectId, user.id, params) }, 202);
});
