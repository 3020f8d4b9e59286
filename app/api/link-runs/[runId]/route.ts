import { requireProjectRole, requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { runDeleteQuerySchema, runPatchSchema } from '@/lib/schemas/link-runs';
import { deleteRun, getRun, runProject, updateRun } from '@/lib/services/link-runs';

type P = { runId: string };

export const GET = route<P>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return json({ run: await getRun(runId) });
});

/** `{ name?, note?, archived? }` → the run as GET returns it. */
export const PATCH = route<P>(async (req, { runId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await runProject(runId),
    'editor',
    req,
    'change link runs',
  );
  const patch = runPatchSchema.parse(await jsonBody(req));
  return json({ run: await updateRun(runId, user.id, patch) });
});

/** 204; 409 `run_in_use` listing `details.analyses` unless `?withAnalyses=1` deletes them too. */
export const DELETE = route<P>(async (req, { runId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await runProject(runId),
    'editor',
    req,
    'delete link runs',
  );
  const query = runDeleteQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  await deleteRun(runId, user.id, query.withAnalyses === '1');
  return new Response(null, { status: 204 });
});
