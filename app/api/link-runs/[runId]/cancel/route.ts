import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { cancelRun, getRun, runProject } from '@/lib/services/link-runs';

export const POST = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'editor', req, 'cancel link runs');
  await cancelRun(runId);
  return json({ run: await getRun(runId) }, 202);
});
