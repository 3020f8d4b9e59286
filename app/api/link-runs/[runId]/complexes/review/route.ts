import { requireProjectRole, requireUser } from '@/lib/auth/access';
import { roleAtLeast } from '@/lib/auth/roles';
import { json, jsonBody, route } from '@/lib/http/handler';
import { bulkReviewSchema, complexFilterSchema } from '@/lib/schemas/complexes';
import { bulkReview, reviewProgress } from '@/lib/services/complexes';
import { runProject } from '@/lib/services/link-runs';

/**
 * Review progress of the run and of the list's filters (the query string's filter keys), and
 * whether the caller may review (so the pages offer verdict keys and bulk review only then).
 */
export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireUser(req);
  const filter = complexFilterSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { role } = await requireProjectRole(await runProject(runId), 'viewer', req);
  return json({ ...(await reviewProgress(runId, filter)), canReview: roleAtLeast(role, 'editor') });
});

/** One verdict and note for every complex of a filter or of a list of ids (editor and up). */
export const POST = route<{ runId: string }>(async (req, { runId }) => {
  await requireUser(req);
  const input = bulkReviewSchema.parse(await jsonBody(req));
  const { user } = await requireProjectRole(
    await runProject(runId),
    'editor',
    req,
    'review complexes',
  );
  return json(await bulkReview(runId, user.id, input));
});
