import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { getRun, runProject } from '@/lib/services/link-runs';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return json({ run: await getRun(runId) });
});
