import { requireProjectRole, requireUser } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { complexIdSchema, complexListSchema } from '@/lib/schemas/complexes';
import { complexNeighbours } from '@/lib/services/complexes';
import { runProject } from '@/lib/services/link-runs';

type P = { runId: string; complexId: string };

/** The complexes before and after this one in the list of the query string's filters and sort. */
export const GET = route<P>(async (req, { runId, complexId }) => {
  await requireUser(req);
  const id = complexIdSchema.parse(complexId);
  const list = complexListSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return json(await complexNeighbours(runId, id, list));
});
