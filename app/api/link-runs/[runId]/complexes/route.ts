import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { complexesPage, complexesQuerySchema } from '@/lib/services/complexes';
import { runProject } from '@/lib/services/link-runs';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  const query = complexesQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return json(await complexesPage(runId, query));
});
